import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startServer } from '../../server/main';
import {
  DEMO_PASSWORD,
  DEMO_USERS,
  CHIP_ANTENNA_ROOM,
  WHIP_ROOM,
  WHIP_BRANCH_ROOM,
  chipAntennaDesign,
} from '../../shared/demo/designs';
import { parseDesign } from '../../shared/rf/design';
import { CHIP_ANTENNA_S1P_NAME, chipAntennaTouchstone } from '../../shared/demo/chip-antenna-touchstone';
import { signIn, startTestServer, type TestServer } from './helpers/test-server';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer({ seedDemo: true });
});
afterAll(async () => {
  await server.close();
});

describe('demo seed', () => {
  it('GET /api/health says the demo accounts are there', async () => {
    expect((await server.agent().get('/api/health').expect(200)).body).toEqual({ ok: true, demo: true });
  });

  it('every demo account signs in with the demo password and sees the three rooms with its role', async () => {
    for (const u of DEMO_USERS) {
      const agent = await signIn(server, u.email, DEMO_PASSWORD);
      expect((await agent.get('/api/me').expect(200)).body).toMatchObject({
        email: u.email,
        displayName: u.displayName,
      });
      const rooms = (await agent.get('/api/rooms').expect(200)).body as { name: string; role: string }[];
      expect(rooms.map((r) => r.name).sort()).toEqual(
        [CHIP_ANTENNA_ROOM, WHIP_ROOM, WHIP_BRANCH_ROOM].sort(),
      );
      for (const r of rooms) expect(r.role).toBe(u.role);
    }
  });

  it('holds the chip antenna room (no elements, goal not met), the whip room with two snapshots and its branch', async () => {
    const agent = await signIn(server, 'tuner@demo.test', DEMO_PASSWORD);
    const rooms = (await agent.get('/api/rooms')).body as {
      id: string;
      name: string;
      parent: { snapshotLabel: string; roomName: string } | null;
    }[];
    const chip = rooms.find((r) => r.name === CHIP_ANTENNA_ROOM)!;
    const design = (await agent.get(`/api/rooms/${chip.id}/design`).expect(200)).body;
    expect(design).toEqual(parseDesign(chipAntennaDesign()));
    expect(design).toMatchObject({
      referenceOhms: 50,
      band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44175e9 },
      sweep: { startHz: 2.0e9, stopHz: 2.9e9, points: 501 },
      goal: { maxVswr: 2 },
      elements: [],
      substrate: { epsilonR: 4.4, heightM: 1.6e-3 },
      drive: { powerW: 0.1 },
      load: { kind: 'rlc', topology: 'series' },
    });

    const whip = rooms.find((r) => r.name === WHIP_ROOM)!;
    const snaps = (await agent.get(`/api/rooms/${whip.id}/snapshots`).expect(200)).body as {
      label: string;
      figures: { goalMet: boolean };
    }[];
    expect(snaps.map((s) => s.label)).toEqual(['E12 values', 'first cut']);
    for (const s of snaps) expect(s.figures.goalMet).toBe(true);

    const branch = rooms.find((r) => r.name === WHIP_BRANCH_ROOM)!;
    expect(branch.parent).toMatchObject({ snapshotLabel: 'E12 values', roomName: WHIP_ROOM });
  });

  it('keeps an invented bench .s1p of the chip antenna among its uploads (not in use) and an observer’s note on the whip', async () => {
    const agent = await signIn(server, 'observer@demo.test', DEMO_PASSWORD);
    const rooms = (await agent.get('/api/rooms')).body as { id: string; name: string }[];
    const chip = rooms.find((r) => r.name === CHIP_ANTENNA_ROOM)!;
    const uploads = (await agent.get(`/api/rooms/${chip.id}/uploads`).expect(200)).body;
    expect(uploads).toEqual([
      expect.objectContaining({
        fileName: CHIP_ANTENNA_S1P_NAME,
        ports: 1,
        points: 141,
        startHz: 1.8e9,
        stopHz: 3.2e9,
        uploadedBy: expect.objectContaining({ displayName: 'Demo Tuner' }),
      }),
    ]);
    const full = (await agent.get(`/api/rooms/${chip.id}/uploads/${uploads[0].id}`).expect(200)).body;
    expect(full.text).toBe(chipAntennaTouchstone());
    expect((await agent.get(`/api/rooms/${chip.id}/design`).expect(200)).body.load.kind).toBe('rlc');
    expect((await agent.get(`/api/rooms/${chip.id}/notes`).expect(200)).body).toEqual([]);

    const whip = rooms.find((r) => r.name === WHIP_ROOM)!;
    const notes = (await agent.get(`/api/rooms/${whip.id}/notes`).expect(200)).body;
    expect(notes).toHaveLength(1);
    expect(notes[0]).toMatchObject({
      author: { displayName: 'Demo Observer' },
      elementId: 'c-shunt',
      parentId: null,
      resolved: false,
    });
    const design = (await agent.get(`/api/rooms/${whip.id}/design`).expect(200)).body;
    expect(design.elements.map((e: { id: string }) => e.id)).toContain('c-shunt');
  });

  it('a second start on the same database does not duplicate anything', async () => {
    const count = async (t: string) => Number((await server.knex(t).count({ n: '*' }).first())!.n);
    const before = {
      users: await count('users'),
      rooms: await count('rooms'),
      snapshots: await count('snapshots'),
      members: await count('room_members'),
      uploads: await count('uploads'),
      notes: await count('notes'),
    };
    expect(before).toEqual({ users: 3, rooms: 3, snapshots: 2, members: 9, uploads: 1, notes: 1 });
    const again = await startServer({ ...server.config }, { clientDir: null });
    try {
      const after = {
        users: await count('users'),
        rooms: await count('rooms'),
        snapshots: await count('snapshots'),
        members: await count('room_members'),
        uploads: await count('uploads'),
        notes: await count('notes'),
      };
      expect(after).toEqual(before);
    } finally {
      await again.close();
    }
  });
});
