/**
 * SQLite busy: another connection holds the write lock of the server's database file for about a second
 * while the API writes. The writes wait (busy_timeout, server/db.ts) and succeed once the lock is gone;
 * none of them is answered with a 500.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp, startTestServer, uniqueEmail, type TestServer } from '../server/helpers/test-server';
import { holdWriteLock } from './lock-holder';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

describe('writes while another connection holds the write lock', () => {
  it('sign-up and room creation wait for the lock and then succeed', async () => {
    const { agent } = await signUp(server);
    const lock = await holdWriteLock(server.config.databaseFile, 1000);
    const signups = [0, 1].map(() =>
      server
        .agent()
        .post('/api/auth/signup')
        .send({ email: uniqueEmail('busy'), password: 'correct horse battery', displayName: 'Busy Tester' }),
    );
    const rooms = [0, 1].map((i) => agent.post('/api/rooms').send({ name: `Busy room ${i}` }));
    const doneAt: number[] = [];
    const results = await Promise.all(
      [...signups, ...rooms].map((req) =>
        req.then((r) => {
          doneAt.push(Date.now());
          return r;
        }),
      ),
    );
    const releasedAt = await lock.released;
    for (const r of results) expect(r.status, JSON.stringify(r.body)).toBeLessThan(500);
    expect(results.slice(0, 2).map((r) => r.status)).toEqual([201, 201]);
    expect(results.slice(2).map((r) => r.status)).toEqual([201, 201]);
    // The writes could not have committed before the holder let go.
    expect(releasedAt - lock.lockedAt).toBeGreaterThanOrEqual(900);
    for (const t of doneAt) expect(t - lock.lockedAt).toBeGreaterThanOrEqual(900);
    const list = await agent.get('/api/rooms').expect(200);
    const names = (list.body as { name: string }[]).map((r) => r.name);
    expect(names).toEqual(expect.arrayContaining(['Busy room 0', 'Busy room 1']));
  });

  it('transactions that read before they write (members, roles, snapshots) also wait and succeed', async () => {
    const owner = await signUp(server);
    const tuner = await signUp(server);
    const roomId = (await owner.agent.post('/api/rooms').send({ name: 'Read then write' }).expect(201)).body.id;
    const lock = await holdWriteLock(server.config.databaseFile, 1000);
    const results = await Promise.all([
      owner.agent.post(`/api/rooms/${roomId}/members`).send({ email: tuner.user.email, role: 'observer' }),
      owner.agent.post(`/api/rooms/${roomId}/members`).send({ email: uniqueEmail('invitee'), role: 'tuner' }),
      owner.agent.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'during the lock' }),
    ]);
    await lock.released;
    // 202: an unknown address is invited by e-mail.
    expect(results.map((r) => r.status)).toEqual([201, 202, 201]);
    await owner.agent.patch(`/api/rooms/${roomId}/members/${tuner.user.id}`).send({ role: 'tuner' }).expect(200);
  });

  it('reads and writes after the lock is released work as before', async () => {
    const { agent } = await signUp(server);
    await agent.post('/api/rooms').send({ name: 'After the lock' }).expect(201);
  });
});
