/**
 * The role matrix: every room route against owner, tuner, observer, a signed-in non-member and an
 * anonymous caller, on a room with owner, tuner, observer and one extra member, and one snapshot. The room
 * is rebuilt after every write that succeeded, so a destructive case cannot affect the next.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type TestAgent from 'supertest/lib/agent';
import { signUp, startTestServer, uniqueEmail, type TestServer } from './helpers/test-server';

type Actor = 'owner' | 'tuner' | 'observer' | 'stranger' | 'anonymous';
const ACTORS: Actor[] = ['owner', 'tuner', 'observer', 'stranger', 'anonymous'];

interface Fixture {
  roomId: string;
  snapshotId: string;
  uploadId: string;
  observerId: string;
  extraId: string;
}

interface Case {
  name: string;
  method: 'get' | 'post' | 'patch' | 'delete';
  path: (f: Fixture) => string;
  body?: object;
  expected: Record<Actor, number>;
}

const any = (ok: number) => ({ owner: ok, tuner: ok, observer: ok, stranger: 404, anonymous: 401 });
const ownerOnly = (ok: number) => ({ owner: ok, tuner: 403, observer: 403, stranger: 404, anonymous: 401 });
const editors = (ok: number) => ({ owner: ok, tuner: ok, observer: 403, stranger: 404, anonymous: 401 });

const CASES: Case[] = [
  { name: 'GET room', method: 'get', path: (f) => `/api/rooms/${f.roomId}`, expected: any(200) },
  {
    name: 'PATCH room',
    method: 'patch',
    path: (f) => `/api/rooms/${f.roomId}`,
    body: { name: 'Renamed' },
    expected: ownerOnly(200),
  },
  { name: 'DELETE room', method: 'delete', path: (f) => `/api/rooms/${f.roomId}`, expected: ownerOnly(204) },
  { name: 'GET design', method: 'get', path: (f) => `/api/rooms/${f.roomId}/design`, expected: any(200) },
  { name: 'GET members', method: 'get', path: (f) => `/api/rooms/${f.roomId}/members`, expected: any(200) },
  {
    name: 'GET invitations',
    method: 'get',
    path: (f) => `/api/rooms/${f.roomId}/invitations`,
    expected: ownerOnly(200),
  },
  {
    name: 'POST member',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/members`,
    body: { email: 'NEWCOMER', role: 'tuner' },
    expected: ownerOnly(201),
  },
  {
    name: 'POST invitation',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/members`,
    body: { email: 'nobody@example.test', role: 'observer' },
    expected: ownerOnly(202),
  },
  {
    name: 'PATCH member',
    method: 'patch',
    path: (f) => `/api/rooms/${f.roomId}/members/${f.observerId}`,
    body: { role: 'tuner' },
    expected: ownerOnly(200),
  },
  {
    name: 'DELETE other member',
    method: 'delete',
    path: (f) => `/api/rooms/${f.roomId}/members/${f.extraId}`,
    expected: ownerOnly(204),
  },
  {
    name: 'POST collab-token',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/collab-token`,
    expected: any(200),
  },
  {
    name: 'POST snapshot',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/snapshots`,
    body: { label: 'by role' },
    expected: editors(201),
  },
  {
    name: 'GET snapshots',
    method: 'get',
    path: (f) => `/api/rooms/${f.roomId}/snapshots`,
    expected: any(200),
  },
  { name: 'GET snapshot', method: 'get', path: (f) => `/api/snapshots/${f.snapshotId}`, expected: any(200) },
  {
    name: 'POST branch',
    method: 'post',
    path: (f) => `/api/snapshots/${f.snapshotId}/branch`,
    body: { name: 'Branch' },
    expected: editors(201),
  },
  {
    name: 'PATCH snapshot',
    method: 'patch',
    path: (f) => `/api/snapshots/${f.snapshotId}`,
    body: { label: 'renamed' },
    expected: editors(200),
  },
  {
    name: 'POST restore',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/snapshots/${f.snapshotId}/restore`,
    expected: editors(200),
  },
  { name: 'GET lineage', method: 'get', path: (f) => `/api/rooms/${f.roomId}/lineage`, expected: any(200) },
  {
    name: 'GET compare',
    method: 'get',
    path: (f) => `/api/rooms/${f.roomId}/compare?a=${f.snapshotId}&b=live`,
    expected: any(200),
  },
  { name: 'GET notes', method: 'get', path: (f) => `/api/rooms/${f.roomId}/notes`, expected: any(200) },
  {
    name: 'POST note',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/notes`,
    body: { body: 'a remark' },
    expected: any(201),
  },
  { name: 'GET uploads', method: 'get', path: (f) => `/api/rooms/${f.roomId}/uploads`, expected: any(200) },
  {
    name: 'POST use upload',
    method: 'post',
    path: (f) => `/api/rooms/${f.roomId}/uploads/${f.uploadId}/use`,
    body: { as: 'load' },
    expected: editors(200),
  },
];

let server: TestServer;
const agents = {} as Record<Actor, TestAgent>;
const ids = {} as Record<'owner' | 'tuner' | 'observer' | 'extra', { id: string; email: string }>;
let newcomerEmail: string;

beforeAll(async () => {
  server = await startTestServer();
  for (const who of ['owner', 'tuner', 'observer', 'extra', 'stranger'] as const) {
    const s = await signUp(server, { displayName: who });
    if (who !== 'extra') agents[who] = s.agent;
    if (who !== 'stranger') ids[who] = { id: s.user.id, email: s.user.email };
  }
  agents.anonymous = server.agent();
  newcomerEmail = (await signUp(server, { email: uniqueEmail('newcomer') })).user.email;
});
afterAll(async () => {
  await server.close();
});

async function fixture(): Promise<Fixture> {
  const owner = agents.owner;
  const roomId = (await owner.post('/api/rooms').send({ name: 'Matrix room' }).expect(201)).body.id;
  for (const [who, role] of [
    ['tuner', 'tuner'],
    ['observer', 'observer'],
    ['extra', 'observer'],
  ] as const)
    await owner.post(`/api/rooms/${roomId}/members`).send({ email: ids[who].email, role }).expect(201);
  const snapshotId = (await owner.post(`/api/rooms/${roomId}/snapshots`).send({ label: 'base' }).expect(201))
    .body.id;
  const s1p = `# GHz S RI R 50\n${Array.from({ length: 11 }, (_, i) => `${(2 + i * 0.1).toFixed(1)} 0.2 0.1`).join('\n')}\n`;
  const uploadId = (
    await owner.post(`/api/rooms/${roomId}/uploads`).attach('file', Buffer.from(s1p), 'load.s1p').expect(201)
  ).body.id;
  return { roomId, snapshotId, uploadId, observerId: ids.observer.id, extraId: ids.extra.id };
}

describe('role matrix', () => {
  const rows = CASES.flatMap((c) => ACTORS.map((actor) => ({ ...c, actor, status: c.expected[actor] })));
  let current: Fixture | null = null;
  it.each(rows)('$name as $actor -> $status', async ({ method, path, body, actor, status }) => {
    const f = (current ??= await fixture());
    if (method !== 'get' && status < 300) current = null;
    const payload =
      body && 'email' in body && body.email === 'NEWCOMER' ? { ...body, email: newcomerEmail } : body;
    const req = agents[actor][method](path(f));
    const res = await (payload ? req.send(payload) : req);
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    if (status >= 400) {
      expect(res.body.error.code).toBe(
        { 401: 'unauthenticated', 403: 'forbidden', 404: 'not-found' }[status],
      );
      expect(JSON.stringify(res.body)).not.toContain('Matrix room');
    }
  });
});

describe('members may leave', () => {
  it.each(['tuner', 'observer'] as const)('a %s may remove themself but nobody else', async (who) => {
    const f = await fixture();
    await agents[who].delete(`/api/rooms/${f.roomId}/members/${f.extraId}`).expect(403);
    await agents[who].delete(`/api/rooms/${f.roomId}/members/${ids[who].id}`).expect(204);
    await agents[who].get(`/api/rooms/${f.roomId}`).expect(404);
  });
});
