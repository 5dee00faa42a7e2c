import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTokenService } from '../../server/auth/tokens';
import { parseDesign } from '../../shared/rf/design';
import { chipAntennaDesign, defaultDesign } from '../../shared/demo/designs';
import { signUp, startTestServer, type TestServer } from './helpers/test-server';

let server: TestServer;
let owner: Awaited<ReturnType<typeof signUp>>;
let stranger: Awaited<ReturnType<typeof signUp>>;

beforeAll(async () => {
  server = await startTestServer();
  owner = await signUp(server, { displayName: 'Room Owner' });
  stranger = await signUp(server, { displayName: 'Stranger' });
});
afterAll(async () => {
  await server.close();
});

describe('POST /api/rooms', () => {
  it('creates a room with the default design; the creator is its owner', async () => {
    const res = await owner.agent.post('/api/rooms').send({ name: '  Bench board  ' }).expect(201);
    expect(res.body).toMatchObject({
      id: expect.stringMatching(/^[A-Za-z0-9_-]{22,}$/),
      name: 'Bench board',
      role: 'owner',
      parent: null,
    });
    expect(res.body.members).toEqual([
      expect.objectContaining({ userId: owner.user.id, role: 'owner', displayName: 'Room Owner' }),
    ]);
    const design = await owner.agent.get(`/api/rooms/${res.body.id}/design`).expect(200);
    expect(design.body).toEqual(parseDesign(defaultDesign('Bench board')));
    expect(design.body).toMatchObject({
      referenceOhms: 50,
      elements: [],
      band: { startHz: 2.4e9, stopHz: 2.4835e9 },
    });
  });

  it('keeps a given design exactly', async () => {
    const res = await owner.agent
      .post('/api/rooms')
      .send({ name: 'Chip antenna', design: chipAntennaDesign() })
      .expect(201);
    const design = await owner.agent.get(`/api/rooms/${res.body.id}/design`).expect(200);
    expect(design.body).toEqual(parseDesign(chipAntennaDesign()));
  });

  it('gives every room its own unguessable id', async () => {
    const ids = new Set<string>();
    for (let i = 0; i < 5; i++)
      ids.add(
        (
          await owner.agent
            .post('/api/rooms')
            .send({ name: `r${i}` })
            .expect(201)
        ).body.id,
      );
    expect(ids.size).toBe(5);
    for (const id of ids) expect(Buffer.from(id, 'base64url').byteLength).toBeGreaterThanOrEqual(16);
  });

  it.each([
    [{}, 'name: is required'],
    [{ name: '' }, 'name: must not be empty'],
    [{ name: 7 }, 'name: must be a string'],
    [{ name: 'x'.repeat(201) }, 'name: must be at most 200 characters'],
  ])('answers 400 for %o', async (body, message) => {
    const res = await owner.agent.post('/api/rooms').send(body).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid-input', message });
  });

  it('answers 400 naming the JSON path of a bad design', async () => {
    const bad = { ...chipAntennaDesign(), band: { startHz: -1, stopHz: 2.4835e9 } };
    const res = await owner.agent.post('/api/rooms').send({ name: 'bad', design: bad }).expect(400);
    expect(res.body.error.code).toBe('invalid-design');
    expect(res.body.error.message).toMatch(/^design\.band\.startHz: /);
    expect(res.body.error.path).toBe('design.band.startHz');
    const el = { ...chipAntennaDesign(), elements: [{ id: 'a', kind: 'series-l', value: 'big' }] };
    const res2 = await owner.agent.post('/api/rooms').send({ name: 'bad', design: el }).expect(400);
    expect(res2.body.error.message).toMatch(/^design\.elements\[0\]\.value: /);
    const res3 = await owner.agent.post('/api/rooms').send({ name: 'bad', design: 'a string' }).expect(400);
    expect(res3.body.error.message).toMatch(/^design: /);
  });

  it('needs a session', async () => {
    const res = await server.agent().post('/api/rooms').send({ name: 'x' }).expect(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});

describe('GET /api/rooms', () => {
  it('lists only the rooms the user belongs to, with role, times and parent', async () => {
    const a = await signUp(server);
    const b = await signUp(server);
    const mine = (await a.agent.post('/api/rooms').send({ name: 'Mine' }).expect(201)).body;
    await b.agent.post('/api/rooms').send({ name: 'Theirs' }).expect(201);
    const list = (await a.agent.get('/api/rooms').expect(200)).body;
    expect(list).toEqual([
      {
        id: mine.id,
        name: 'Mine',
        role: 'owner',
        createdAt: expect.any(Number),
        updatedAt: expect.any(Number),
        parent: null,
      },
    ]);
    expect(list[0].updatedAt).toBeGreaterThanOrEqual(list[0].createdAt);
  });

  it('is 401 when signed out', async () => {
    await server.agent().get('/api/rooms').expect(401);
  });
});

describe('one room', () => {
  it('GET /api/rooms/:id gives details, the caller role and the members', async () => {
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Details' }).expect(201)).body;
    const res = await owner.agent.get(`/api/rooms/${room.id}`).expect(200);
    expect(res.body).toMatchObject({ id: room.id, name: 'Details', role: 'owner', createdBy: owner.user.id });
    expect(res.body.members).toHaveLength(1);
  });

  it('a non-member gets 404 for every room route and never sees the data', async () => {
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Secret project' }).expect(201)).body;
    for (const [method, path] of [
      ['get', ''],
      ['get', '/design'],
      ['get', '/members'],
      ['get', '/snapshots'],
      ['post', '/collab-token'],
      ['patch', ''],
      ['delete', ''],
    ] as const) {
      const res = await stranger.agent[method](`/api/rooms/${room.id}${path}`)
        .send({ name: 'x' })
        .expect(404);
      expect(res.body.error.code).toBe('not-found');
      expect(JSON.stringify(res.body)).not.toContain('Secret project');
    }
    // A room that does not exist, or a malformed id, looks the same.
    expect((await owner.agent.get('/api/rooms/AAAAAAAAAAAAAAAAAAAAAA').expect(404)).body.error.code).toBe(
      'not-found',
    );
    expect((await owner.agent.get('/api/rooms/%20bad%20id').expect(404)).body.error.code).toBe('not-found');
  });

  it('PATCH renames (owner); bad name is 400', async () => {
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Old' }).expect(201)).body;
    const res = await owner.agent.patch(`/api/rooms/${room.id}`).send({ name: 'New name' }).expect(200);
    expect(res.body.name).toBe('New name');
    expect((await owner.agent.get(`/api/rooms/${room.id}`)).body.name).toBe('New name');
    await owner.agent.patch(`/api/rooms/${room.id}`).send({ name: '' }).expect(400);
    await owner.agent.patch(`/api/rooms/${room.id}`).send({}).expect(400);
  });

  it('DELETE removes the room and everything in it', async () => {
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Doomed' }).expect(201)).body;
    await owner.agent.post(`/api/rooms/${room.id}/snapshots`).send({ label: 'keep?' }).expect(201);
    await owner.agent.delete(`/api/rooms/${room.id}`).expect(204);
    await owner.agent.get(`/api/rooms/${room.id}`).expect(404);
    for (const table of ['room_members', 'room_states', 'room_updates', 'snapshots'])
      expect(await server.knex(table).where({ room_id: room.id })).toHaveLength(0);
  });

  it('POST /collab-token gives a 60 s token naming the room and the caller role', async () => {
    const room = (await owner.agent.post('/api/rooms').send({ name: 'Tokens' }).expect(201)).body;
    const res = await owner.agent.post(`/api/rooms/${room.id}/collab-token`).expect(200);
    expect(res.body).toMatchObject({
      token: expect.any(String),
      roomId: room.id,
      role: 'owner',
      expiresInSeconds: 60,
    });
    const tokens = createTokenService(server.config.jwtSecret);
    expect(await tokens.verifyCollab(res.body.token)).toEqual({
      userId: owner.user.id,
      roomId: room.id,
      role: 'owner',
    });
    const payload = JSON.parse(Buffer.from(res.body.token.split('.')[1], 'base64url').toString());
    expect(payload.exp - payload.iat).toBe(60);
    // Not a session.
    expect(await tokens.verifySession(res.body.token)).toBeNull();
  });
});
