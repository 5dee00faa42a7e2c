/**
 * The server on PostgreSQL: run by scripts/pg-test.sh, which starts a throwaway cluster and sets
 * DATABASE_URL. Without DATABASE_URL the plain test run leaves the file out (vite.config.ts).
 * Expects an empty database: the migrations run from scratch.
 */
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig, type Config } from '../../server/config';
import { startServer, type RunningServer } from '../../server/main';
import { isPostgres } from '../../server/db';
import { compactRoomDocument, loadRoomDesign } from '../../server/collab/store';
import { insertElement, setElementField } from '../../shared/collab/schema';
import { chipAntennaDesign } from '../../shared/demo/designs';
import { parseDesign } from '../../shared/rf/design';
import { roomPeer, waitFor } from '../server/helpers/live';
import { signUp, TEST_PASSWORD, uniqueEmail } from '../server/helpers/test-server';

const databaseUrl = process.env.DATABASE_URL;
// vite.config.ts leaves this file out of the plain run; scripts/pg-test.sh sets DATABASE_URL.
if (!databaseUrl) throw new Error('DATABASE_URL is not set: run scripts/pg-test.sh');

let server: RunningServer;
const live = { agent: () => supertest.agent(server.url) };

describe('PostgreSQL', () => {
  beforeAll(async () => {
    const config: Config = {
      ...loadConfig({
        NODE_ENV: 'test',
        LOG_LEVEL: process.env.PG_TEST_LOG ?? 'silent',
        DATABASE_URL: databaseUrl,
        // The server opens the database through DATABASE_FILE's setting; a postgres:// address there picks pg.
        DATABASE_FILE: databaseUrl,
        JWT_SECRET: 'pg-test-secret-pg-test-secret-pg-test-secret',
        BCRYPT_COST: '4',
      }),
      port: 0,
      host: '127.0.0.1',
      seedDemo: false,
    };
    server = await startServer(config, { clientDir: null });
  });
  afterAll(async () => {
    await server?.close();
  });

  it('ran the migrations on PostgreSQL', async () => {
    expect(isPostgres(server.knex)).toBe(true);
    for (const table of ['users', 'rooms', 'room_members', 'room_updates', 'room_states', 'snapshots', 'notes'])
      expect(await server.knex.schema.hasTable(table), table).toBe(true);
    await live.agent().get('/api/health').expect(200, { ok: true });
  });

  it('signs up, signs in and out', async () => {
    const email = uniqueEmail('pg');
    const { agent, user } = await signUp(live, { email, displayName: 'Pg Owner' });
    expect(user).toMatchObject({ email, displayName: 'Pg Owner' });
    expect((await agent.get('/api/me').expect(200)).body).toMatchObject({ id: user.id, email });
    await live.agent().post('/api/auth/signin').send({ email, password: 'wrong password here' }).expect(401);
    const again = live.agent();
    await again.post('/api/auth/signin').send({ email, password: TEST_PASSWORD }).expect(200);
    await again.get('/api/me').expect(200);
    await again.post('/api/auth/signout').expect((r) => expect(r.status).toBeLessThan(300));
    await again.get('/api/me').expect(401);
    const row = await server.knex('users').where({ id: user.id }).first();
    expect(typeof row.created_at).toBe('number');
  });

  it('creates rooms, adds members and changes roles', async () => {
    const owner = await signUp(live, { displayName: 'Pg Owner' });
    const tuner = await signUp(live, { displayName: 'Pg Tuner' });
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Pg chip antenna', design: chipAntennaDesign() }).expect(201)).body;
    expect(room.id).toEqual(expect.any(String));
    const rooms = (await owner.agent.get('/api/rooms').expect(200)).body;
    expect(rooms).toEqual([expect.objectContaining({ id: room.id, name: 'Pg chip antenna', role: 'owner' })]);
    await owner.agent.post(`/api/rooms/${room.id}/members`).send({ email: tuner.user.email, role: 'observer' }).expect(201);
    expect((await tuner.agent.get('/api/rooms').expect(200)).body).toEqual([
      expect.objectContaining({ id: room.id, role: 'observer' }),
    ]);
    await owner.agent.patch(`/api/rooms/${room.id}/members/${tuner.user.id}`).send({ role: 'tuner' }).expect(200);
    expect((await tuner.agent.get('/api/rooms').expect(200)).body[0].role).toBe('tuner');
    await tuner.agent.post(`/api/rooms/${room.id}/members`).send({ email: uniqueEmail(), role: 'tuner' }).expect(403);
    const design = (await tuner.agent.get(`/api/rooms/${room.id}/design`).expect(200)).body;
    expect(design).toEqual(parseDesign(chipAntennaDesign()));
  });

  it('stores an edit made through a real y-websocket peer; the design and snapshots reflect it', async () => {
    const owner = await signUp(live, { displayName: 'Pg Editor' });
    const roomId = (await owner.agent.post('/api/rooms').send({ name: 'Pg edits', design: chipAntennaDesign() }).expect(201)).body.id;
    const peer = roomPeer(server.url, owner.cookie, roomId);
    try {
      await peer.synced;
      insertElement(peer.doc, { id: 'l1', kind: 'series-l', value: 2.2e-9 });
      setElementField(peer.doc, 'l1', 'value', 2.7e-9);
      const design = await waitFor(async () => {
        const d = (await owner.agent.get(`/api/rooms/${roomId}/design`).expect(200)).body;
        return d.elements.length === 1 && d.elements[0].value === 2.7e-9 ? d : undefined;
      }, 'the socket edit in GET /api/rooms/:id/design');
      expect(design.elements).toEqual([{ id: 'l1', kind: 'series-l', value: 2.7e-9 }]);
    } finally {
      peer.destroy();
    }
    const updates = async () => Number((await server.knex('room_updates').where({ room_id: roomId }).count({ n: '*' }))[0]!.n);
    expect(await updates()).toBeGreaterThan(0);
    // The collab store's compaction (server/collab/store.ts) folds the log into room_states on PostgreSQL too.
    await compactRoomDocument(server.knex, roomId);
    expect(await updates()).toBe(0);
    expect((await loadRoomDesign(server.knex, roomId)).elements).toEqual([{ id: 'l1', kind: 'series-l', value: 2.7e-9 }]);

    const a = (await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'one part' }).expect(201)).body;
    expect(a.figures.partCount).toBe(1);
    const b = (await owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'second' }).expect(201)).body;
    const list = (await owner.agent.get(`/api/rooms/${roomId}/snapshots`).expect(200)).body as { id: string }[];
    expect(list.map((s) => s.id)).toEqual([b.id, a.id]);
    const full = (await owner.agent.get(`/api/snapshots/${a.id}`).expect(200)).body;
    expect(full.design.elements).toEqual([{ id: 'l1', kind: 'series-l', value: 2.7e-9 }]);
    const branch = (await owner.agent.post(`/api/snapshots/${a.id}/branch`).send({ name: 'Pg branch' }).expect(201)).body;
    const branched = (await owner.agent.get(`/api/rooms/${branch.roomId}/design`).expect(200)).body;
    expect(branched.elements).toEqual([{ id: 'l1', kind: 'series-l', value: 2.7e-9 }]);
  });
});
