// The hand-off routes on a real server and SQLite file: who may download, the attachment headers, the
// zip's contents, the query check, and a design the engine refuses (409, never a 500).
import { strFromU8, unzipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HANDOFF_FILES } from '../../shared/handoff/files';
import { parseDesign } from '../../shared/rf/design';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { binary, chainDesign, refusedDesign, roomWithMembers, type RoomWithMembers } from './helpers';

describe('hand-off pack routes', () => {
  let server: TestServer;
  let room: RoomWithMembers;
  const name = 'Chip antenna — Łódź bench (rev B)';

  beforeAll(async () => {
    server = await startTestServer();
    room = await roomWithMembers(server, name, chainDesign());
  });
  afterAll(async () => {
    await server?.close();
  });

  it('answers 401 without a session, 404 to a non-member, 404 for a room that does not exist', async () => {
    const anon = server.agent();
    await anon.get(`/api/rooms/${room.roomId}/handoff.zip`).expect(401);
    await anon.get(`/api/rooms/${room.roomId}/exports/bom.csv`).expect(401);
    const res = await room.outsider.get(`/api/rooms/${room.roomId}/handoff.zip`).expect(404);
    expect(res.body.error.code).toBe('not-found');
    await room.outsider.get(`/api/rooms/${room.roomId}/exports/report.pdf`).expect(404);
    await room.owner.get('/api/rooms/AAAAAAAAAAAAAAAAAAAAAA/handoff.zip').expect(404);
  });

  it('lets an observer download the zip (a read-only export) with every file of the pack', async () => {
    const res = await room.observer.get(`/api/rooms/${room.roomId}/handoff.zip`).buffer(true).parse(binary).expect(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toBe('attachment; filename="chip-antenna-lodz-bench-rev-b-handoff.zip"');
    expect(res.headers['cache-control']).toContain('no-store');
    const files = unzipSync(new Uint8Array(res.body as Buffer));
    expect(Object.keys(files).sort()).toEqual([...HANDOFF_FILES].sort());
    const design = parseDesign(JSON.parse(strFromU8(files['design.matchloom.json'])));
    expect(design.elements.map((e) => e.id)).toEqual(['l1', 'c1', 'tl1', 'st1', 'st2', 'r1']);
    expect(strFromU8(files['bom.csv']).split('\r\n')[0]).toMatch(/^ref,id,label,kind,unit,exact value,/);
    expect(strFromU8(files['network.s2p'])).toContain('# GHz S RI R 50');
    expect(strFromU8(files['report.pdf'].subarray(0, 5))).toBe('%PDF-');
  });

  it('serves each file singly as an attachment named from a slug of the room name', async () => {
    const expected: Record<string, [string, RegExp]> = {
      'bom.csv': ['chip-antenna-lodz-bench-rev-b-bom.csv', /^text\/csv; charset=utf-8/],
      'lines.csv': ['chip-antenna-lodz-bench-rev-b-lines.csv', /^text\/csv; charset=utf-8/],
      'network.s2p': ['chip-antenna-lodz-bench-rev-b-network.s2p', /^text\/plain/],
      'matched-input.s1p': ['chip-antenna-lodz-bench-rev-b-matched-input.s1p', /^text\/plain/],
      'design.matchloom.json': ['chip-antenna-lodz-bench-rev-b.matchloom.json', /^application\/json/],
      'report.pdf': ['chip-antenna-lodz-bench-rev-b-report.pdf', /^application\/pdf/],
    };
    for (const file of HANDOFF_FILES) {
      const res = await room.observer.get(`/api/rooms/${room.roomId}/exports/${file}`).buffer(true).parse(binary).expect(200);
      expect(res.headers['content-disposition'], file).toBe(`attachment; filename="${expected[file][0]}"`);
      expect(res.headers['content-type'], file).toMatch(expected[file][1]);
      expect((res.body as Buffer).byteLength, file).toBeGreaterThan(100);
    }
  });

  it('an unknown export is a 404 that lists the pack; a bad series is a 400 naming the field', async () => {
    const res = await room.owner.get(`/api/rooms/${room.roomId}/exports/secrets.txt`).expect(404);
    expect(res.body.error.message).toContain('bom.csv');
    const bad = await room.owner.get(`/api/rooms/${room.roomId}/exports/bom.csv?series=E7`).expect(400);
    expect(bad.body.error.field).toBe('series');
    expect(bad.body.error.message).toMatch(/^series: must be one of E12, E24, E48, E96/);
    await room.owner.get(`/api/rooms/${room.roomId}/handoff.zip?series=E3`).expect(400);
    await room.owner.get(`/api/rooms/${room.roomId}/exports/bom.csv?series=e12`).expect(200);
  });

  it('a design the engine refuses gives 409 with the reason for analysed files, and still exports the design and lines', async () => {
    const created = await room.owner.post('/api/rooms').send({ name: 'Refused', design: refusedDesign() }).expect(201);
    const id = created.body.id as string;
    const zip = await room.owner.get(`/api/rooms/${id}/handoff.zip`).expect(409);
    expect(zip.body.error.code).toBe('analysis-failed');
    // The engine names the measured range the sweep leaves (CONTRACT §2, measured loads).
    expect(zip.body.error.message).toMatch(/cannot be analysed.*outside the measured range/);
    for (const file of ['bom.csv', 'network.s2p', 'matched-input.s1p', 'report.pdf']) {
      const res = await room.owner.get(`/api/rooms/${id}/exports/${file}`).expect(409);
      expect(res.body.error.code, file).toBe('analysis-failed');
    }
    await room.owner.get(`/api/rooms/${id}/exports/design.matchloom.json`).expect(200);
    await room.owner.get(`/api/rooms/${id}/exports/lines.csv`).expect(200);
  });
});
