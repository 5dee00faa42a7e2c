import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp, startTestServer, uniqueEmail, type TestServer } from './helpers/test-server';

let server: TestServer;
let owner: Awaited<ReturnType<typeof signUp>>;

beforeAll(async () => {
  server = await startTestServer();
  owner = await signUp(server, { displayName: 'Owner' });
});
afterAll(async () => {
  await server.close();
});

async function newRoom(): Promise<string> {
  return (await owner.agent.post('/api/rooms').send({ name: 'Members room' }).expect(201)).body.id;
}

describe('POST /api/rooms/:id/members', () => {
  it('adds an existing account (address in any case) with 201; the member then sees the room', async () => {
    const roomId = await newRoom();
    const tuner = await signUp(server, { displayName: 'Tuner' });
    const res = await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: ` ${tuner.user.email.toUpperCase()} `, role: 'tuner' })
      .expect(201);
    expect(res.body).toEqual({
      userId: tuner.user.id,
      email: tuner.user.email,
      displayName: 'Tuner',
      role: 'tuner',
      joinedAt: expect.any(Number),
    });
    const rooms = (await tuner.agent.get('/api/rooms').expect(200)).body;
    expect(rooms).toEqual([expect.objectContaining({ id: roomId, role: 'tuner' })]);
    const members = (await tuner.agent.get(`/api/rooms/${roomId}/members`).expect(200)).body;
    expect(members.map((m: { role: string }) => m.role)).toEqual(['owner', 'tuner']);
  });

  it('refuses to add a member twice (409)', async () => {
    const roomId = await newRoom();
    const u = await signUp(server);
    await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: u.user.email, role: 'observer' })
      .expect(201);
    const res = await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: u.user.email, role: 'tuner' })
      .expect(409);
    expect(res.body.error.code).toBe('already-member');
  });

  it('stores an invitation (202) for an address without an account; a repeat replaces it', async () => {
    const roomId = await newRoom();
    const email = uniqueEmail('invitee');
    const res = await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email, role: 'observer' })
      .expect(202);
    expect(res.body).toMatchObject({ invited: true, email, role: 'observer' });
    await owner.agent.post(`/api/rooms/${roomId}/members`).send({ email, role: 'tuner' }).expect(202);
    const rows = await server.knex('invitations').where({ room_id: roomId });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ email, role: 'tuner', invited_by: owner.user.id });
    expect(Number(rows[0].expires_at)).toBeGreaterThan(Date.now());
    const list = (await owner.agent.get(`/api/rooms/${roomId}/invitations`).expect(200)).body;
    expect(list).toEqual([expect.objectContaining({ email, role: 'tuner' })]);
    // An invitation is not a membership.
    expect((await owner.agent.get(`/api/rooms/${roomId}/members`)).body).toHaveLength(1);
  });

  it.each([
    [{ role: 'tuner' }, 'email: is required'],
    [{ email: 'not-an-address', role: 'tuner' }, 'email: must be a valid e-mail address'],
    [{ email: 'a@example.test' }, 'role: is required'],
    [{ email: 'a@example.test', role: 'admin' }, 'role: must be "owner", "tuner" or "observer"'],
  ])('answers 400 for %o', async (body, message) => {
    const roomId = await newRoom();
    const res = await owner.agent.post(`/api/rooms/${roomId}/members`).send(body).expect(400);
    expect(res.body.error.message).toBe(message);
  });
});

describe('PATCH /api/rooms/:id/members/:userId', () => {
  it('changes a role', async () => {
    const roomId = await newRoom();
    const u = await signUp(server);
    await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: u.user.email, role: 'observer' })
      .expect(201);
    const res = await owner.agent
      .patch(`/api/rooms/${roomId}/members/${u.user.id}`)
      .send({ role: 'tuner' })
      .expect(200);
    expect(res.body).toMatchObject({ userId: u.user.id, role: 'tuner' });
    expect((await u.agent.get(`/api/rooms/${roomId}`)).body.role).toBe('tuner');
    // The new role applies at once: a tuner may snapshot.
    await u.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'now allowed' }).expect(201);
  });

  it('cannot demote the last owner (409), but can once there is a second owner', async () => {
    const roomId = await newRoom();
    const res = await owner.agent
      .patch(`/api/rooms/${roomId}/members/${owner.user.id}`)
      .send({ role: 'tuner' })
      .expect(409);
    expect(res.body.error.code).toBe('last-owner');
    const second = await signUp(server);
    await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: second.user.email, role: 'owner' })
      .expect(201);
    await owner.agent
      .patch(`/api/rooms/${roomId}/members/${owner.user.id}`)
      .send({ role: 'observer' })
      .expect(200);
    // Now an observer: no longer allowed to manage members.
    await owner.agent
      .patch(`/api/rooms/${roomId}/members/${second.user.id}`)
      .send({ role: 'tuner' })
      .expect(403);
    await second.agent
      .patch(`/api/rooms/${roomId}/members/${second.user.id}`)
      .send({ role: 'tuner' })
      .expect(409);
  });

  it('is 404 for a user who is not a member, 400 for a bad role', async () => {
    const roomId = await newRoom();
    const u = await signUp(server);
    expect(
      (
        await owner.agent
          .patch(`/api/rooms/${roomId}/members/${u.user.id}`)
          .send({ role: 'tuner' })
          .expect(404)
      ).body.error.code,
    ).toBe('not-found');
    await owner.agent
      .patch(`/api/rooms/${roomId}/members/${owner.user.id}`)
      .send({ role: 'boss' })
      .expect(400);
    await owner.agent.patch(`/api/rooms/${roomId}/members/${owner.user.id}`).send({}).expect(400);
  });
});

describe('DELETE /api/rooms/:id/members/:userId', () => {
  it('removes a member, who then gets 404 for the room', async () => {
    const roomId = await newRoom();
    const u = await signUp(server);
    await owner.agent
      .post(`/api/rooms/${roomId}/members`)
      .send({ email: u.user.email, role: 'tuner' })
      .expect(201);
    await owner.agent.delete(`/api/rooms/${roomId}/members/${u.user.id}`).expect(204);
    await u.agent.get(`/api/rooms/${roomId}/design`).expect(404);
    await owner.agent.delete(`/api/rooms/${roomId}/members/${u.user.id}`).expect(404);
  });

  it('the last owner cannot leave (409)', async () => {
    const roomId = await newRoom();
    const res = await owner.agent.delete(`/api/rooms/${roomId}/members/${owner.user.id}`).expect(409);
    expect(res.body.error.code).toBe('last-owner');
  });
});
