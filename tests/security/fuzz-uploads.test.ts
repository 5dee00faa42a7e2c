// Multipart uploads (POST /api/rooms/:id/uploads) with hostile parts: random and wrong Touchstone text,
// hostile file names (path tricks, NUL, very long, odd extensions), the wrong field, several files,
// broken multipart framing, over-size files. 201 for a file that parses, else a clean 4xx; a refusal
// writes nothing and an accepted upload's stored name never carries a path.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { roomFixture, type RoomFixture } from './helpers/fixtures';
import { expectPrototypeClean, hostileString, probe, runs, type FuzzTarget } from './helpers/fuzz';

let server: TestServer;
let t: FuzzTarget;
let f: RoomFixture;

beforeAll(async () => {
  server = await startTestServer();
  t = { baseUrl: server.url, knex: server.knex };
  f = await roomFixture(server.url);
});
afterAll(async () => {
  await server.close();
  expectPrototypeClean();
});

const GOOD_S1P = '# GHz S RI R 50\n2.3 0.2 0.1\n2.4 0.21 0.11\n2.5 0.22 0.12\n';
const GOOD_S2P = '# GHz S MA R 50\n2.4 0.1 0 0.9 10 0.9 10 0.1 0\n2.5 0.1 0 0.9 11 0.9 11 0.1 0\n';

const fileName = fc.oneof(
  fc.constantFrom('load.s1p', 'amp.s2p', 'LOAD.S1P', '../../../etc/passwd.s1p', '..\\..\\x.s1p', '/abs/path.s1p', 'a\u0000.s1p', 'x.s1p.exe', 'x.exe', 'x', '.s1p', 'x.s3p', 'x.s1p ', '"quoted".s1p', 'é'.repeat(200) + '.s1p', 'a'.repeat(400) + '.s1p', '<img src=x>.s1p'),
  hostileString.map((s) => `${s}.s1p`),
);
const content = fc.oneof(
  fc.constantFrom(GOOD_S1P, GOOD_S2P, '', '!only a comment\n', GOOD_S1P.replace('0.21', 'NaN'), '[Version] ' + 'x'.repeat(5000), '\u0000\u0001\u0002'),
  fc.string({ maxLength: 300 }),
  fc.uint8Array({ maxLength: 300 }).map((b) => Buffer.from(b).toString('latin1')),
);

/** A multipart body by hand, so the framing itself can be wrong. */
function multipart(parts: { field: string; name?: string; body: string; type?: string }[], boundary = 'zzBoundaryzz', broken = false): { body: Buffer; contentType: string } {
  const chunks = parts.map((p) =>
    `--${boundary}\r\nContent-Disposition: form-data; name="${p.field}"${p.name !== undefined ? `; filename="${p.name.replace(/"/g, '%22').replace(/[\r\n]/g, '')}"` : ''}\r\n` +
    `${p.type ? `Content-Type: ${p.type}\r\n` : ''}\r\n${p.body}\r\n`,
  );
  const end = broken ? '' : `--${boundary}--\r\n`;
  return { body: Buffer.from(chunks.join('') + end, 'latin1'), contentType: `multipart/form-data; boundary=${boundary}` };
}

describe('POST /api/rooms/:id/uploads', () => {
  it('hostile files, names, fields and framing: 201 or a clean 4xx, no write on refusal', async () => {
    const part = fc.record({ field: fc.constantFrom('file', 'file', 'file', 'other', 'file[]', ''), name: fc.option(fileName, { nil: undefined }), body: content, type: fc.option(fc.constantFrom('text/plain', 'application/octet-stream', 'image/png'), { nil: undefined }) });
    await fc.assert(
      fc.asyncProperty(fc.array(part, { minLength: 0, maxLength: 3 }), fc.boolean(), async (parts, broken) => {
        const { body, contentType } = multipart(parts, 'zzBoundaryzz', broken);
        const status = await probe(t, { method: 'POST', path: `/api/rooms/${f.roomId}/uploads`, cookie: f.owner.cookie, body, headers: { 'content-type': contentType } });
        expect([201, 400, 413, 415]).toContain(status);
      }),
      runs(821, 120),
    );
    const names = (await server.knex('uploads').where({ room_id: f.roomId }).pluck('file_name')) as string[];
    for (const n of names) {
      expect(n, 'a stored upload name keeps a path').not.toMatch(/[/\\]/);
      expect(n).not.toContain('\u0000');
    }
  }, 120_000);

  it('a file over the size limit is 413 and nothing is stored', async () => {
    const { body, contentType } = multipart([{ field: 'file', name: 'huge.s1p', body: GOOD_S1P + '! padding\n'.repeat(540_000) }]);
    const status = await probe(t, { method: 'POST', path: `/api/rooms/${f.roomId}/uploads`, cookie: f.owner.cookie, body, headers: { 'content-type': contentType } });
    expect(status).toBe(413);
  });

  it('an observer is refused before the file is read (403), whatever the body', async () => {
    const { body, contentType } = multipart([{ field: 'file', name: 'load.s1p', body: GOOD_S1P }]);
    expect(await probe(t, { method: 'POST', path: `/api/rooms/${f.roomId}/uploads`, cookie: f.observer.cookie, body, headers: { 'content-type': contentType } })).toBe(403);
  });
});
