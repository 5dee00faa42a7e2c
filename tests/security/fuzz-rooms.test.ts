// Property-based hostile bodies and path ids against the room routes (rooms, rename, design, members,
// roles, collab token, snapshots, branch), sent by the room's owner so that every check past access
// control is reached: never a 5xx, the error shape on every 4xx, and a refused request writes nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { changedTables, fingerprint } from './helpers/db';
import { encodeAny } from './helpers/routes';
import { markedDesign, roomFixture, type RoomFixture } from './helpers/fixtures';
import {
  expectPrototypeClean,
  hostileString,
  hostileValue,
  probe,
  rawBody,
  requestWithRaw,
  runs,
  shapedBody,
  type FuzzTarget,
} from './helpers/fuzz';

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

type Json = unknown;

/** Every path into a JSON value (objects and arrays), the root excluded. */
function paths(v: Json, prefix: (string | number)[] = []): (string | number)[][] {
  if (v === null || typeof v !== 'object') return [];
  const out: (string | number)[][] = [];
  for (const [k, child] of Object.entries(v)) {
    const key = Array.isArray(v) ? Number(k) : k;
    out.push([...prefix, key], ...paths(child, [...prefix, key]));
  }
  return out;
}

/** A copy of `v` with the value at `path` replaced (or removed when `value` is undefined). */
function mutate(v: Json, path: (string | number)[], value: Json): Json {
  const copy = structuredClone(v) as Record<string | number, Json>;
  let node = copy;
  for (const k of path.slice(0, -1)) node = node[k] as Record<string | number, Json>;
  const last = path[path.length - 1];
  if (value === undefined) delete node[last];
  else node[last] = value;
  return copy;
}

const base = markedDesign('fuzz');
const designPaths = paths(base);
/** A valid design with one or two places replaced by hostile values or removed. */
const hostileDesign: fc.Arbitrary<Json> = fc.oneof(
  fc
    .array(fc.tuple(fc.constantFrom(...designPaths), fc.option(hostileValue, { nil: undefined })), { minLength: 1, maxLength: 2 })
    .map((changes) => changes.reduce<Json>((d, [p, v]) => { try { return mutate(d, p, v); } catch { return d; } }, base)),
  fc.constantFrom<Json>(
    { ...base, elements: Array.from({ length: 5000 }, (_, i) => ({ id: `e${i}`, kind: 'series-l', value: 1e-9 })) },
    { ...base, sweep: { startHz: 1, stopHz: 1e12, points: 1e9 } },
    { ...base, sweep: { startHz: 1, stopHz: 1e12, points: 1e6 } },
    { ...base, load: { kind: 'measured', touchstone: `# GHz S RI R 50\n${'1 0 0\n'.repeat(10)}` } },
    { ...base, load: { kind: 'measured', touchstone: '[Version] ' + 'x'.repeat(100_000) } },
    { ...base, load: { kind: 'table', points: [[1, 1, 1]] } },
    { ...base, elements: [{ id: 'a', kind: 'two-port', touchstone: '! empty' }] },
    { ...base, elements: [{ id: 'a', kind: 'line', z0: 50, length: { degrees: 1e308, atHz: 5e-324 } }] },
    { ...base, elements: [{ id: 'a', kind: 'transformer', ratio: 1e-300 }] },
    { ...base, elements: [{ id: 'a', kind: 'shunt-c', value: 1e-12 }, { id: 'a', kind: 'shunt-c', value: 2e-12 }] },
    { ...base, name: 'x'.repeat(1_000_000) },
    { ...base, __proto__: { polluted: 'yes' } },
  ),
  hostileValue,
);

const roomName = fc.string({ minLength: 1, maxLength: 200 });
const role = fc.constantFrom('owner', 'tuner', 'observer');

const hostileId = fc.oneof(
  hostileString.filter((s) => s.length > 0 && s.length < 2000),
  fc.constantFrom('..', '.', '%2e%2e', '%00', '%ZZ', '%', '%E0%A4%A', ' ', 'a'.repeat(65), 'a'.repeat(5000), '0', '-1', 'null', 'undefined', '[object Object]'),
);
/** A hostile id placed raw in the path (encoding left to chance: some are percent-encoded, some not). */
// (Bytes outside printable ASCII are always encoded: raw, they are not HTTP, and Node's parser refuses
// the request line before the app sees it.)
const idInPath = fc
  .tuple(hostileId, fc.boolean())
  .map(([id, encode]) => (encode || !/^[\x21-\x7e]*$/.test(id) ? encodeAny(id) : id.replace(/[?#/\\]/g, '_')));

describe('POST /api/rooms', () => {
  it('hostile names and designs: 201 with a parseable design, or refused with nothing written', async () => {
    await fc.assert(
      fc.asyncProperty(shapedBody({ name: roomName, design: hostileDesign }), async (body) => {
        const status = await probe(t, { method: 'POST', path: '/api/rooms', cookie: f.owner.cookie, body });
        expect([201, 400, 413]).toContain(status);
      }),
      runs(811, 100),
    );
  });
  it('raw bodies (a JSON object after a byte-order mark is read as JSON; the rest are refused)', async () => {
    await fc.assert(
      fc.asyncProperty(rawBody, async (raw) => {
        const status = await probe(t, { ...requestWithRaw({ method: 'POST', path: '/api/rooms' }, raw), cookie: f.owner.cookie });
        const bom = typeof raw.body === 'string' && raw.body.startsWith('\uFEFF{');
        if (!bom) expect(status).toBeGreaterThanOrEqual(400);
      }),
      runs(812, 50),
    );
  });
});

describe('room routes with hostile ids in the path', () => {
  const routes: [string, (id: string) => string, unknown][] = [
    ['GET', (id) => `/api/rooms/${id}`, undefined],
    ['PATCH', (id) => `/api/rooms/${id}`, { name: 'renamed' }],
    ['DELETE', (id) => `/api/rooms/${id}`, undefined],
    ['GET', (id) => `/api/rooms/${id}/design`, undefined],
    ['POST', (id) => `/api/rooms/${id}/collab-token`, undefined],
    ['GET', (id) => `/api/rooms/${id}/members`, undefined],
    ['POST', (id) => `/api/rooms/${id}/members`, { email: 'new@example.test', role: 'tuner' }],
    ['PATCH', (id) => `/api/rooms/${f.roomId}/members/${id}`, { role: 'tuner' }],
    ['DELETE', (id) => `/api/rooms/${f.roomId}/members/${id}`, undefined],
    ['GET', (id) => `/api/rooms/${id}/snapshots`, undefined],
    ['POST', (id) => `/api/rooms/${id}/snapshots`, { label: 'x' }],
    ['GET', (id) => `/api/snapshots/${id}`, undefined],
    ['POST', (id) => `/api/snapshots/${id}/branch`, { name: 'x' }],
  ];
  it('every route: a clean 4xx (404 for an id that names nothing), nothing written', async () => {
    const before = await fingerprint(server.knex);
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...routes), idInPath, async ([method, path, body], id) => {
        const status = await probe(t, { method, path: path(id), cookie: f.owner.cookie, body });
        expect(status, `${method} ${path(id)}`).toBeGreaterThanOrEqual(400);
      }),
      runs(813, 150),
    );
    expect(changedTables(before, await fingerprint(server.knex))).toEqual([]);
  });
});

describe('bodies of the room routes', () => {
  it('PATCH /api/rooms/:id {name}', async () => {
    await fc.assert(
      fc.asyncProperty(shapedBody({ name: roomName }), async (body) => {
        expect([200, 400]).toContain(await probe(t, { method: 'PATCH', path: `/api/rooms/${f.roomId}`, cookie: f.owner.cookie, body }));
      }),
      runs(814, 80),
    );
  });

  it('POST /api/rooms/:id/members {email, role}', async () => {
    const email = fc.oneof(fc.emailAddress(), fc.constantFrom(f.tuner.email, f.owner.email, f.observer.email.toUpperCase()));
    await fc.assert(
      fc.asyncProperty(shapedBody({ email, role }), async (body) => {
        expect([201, 202, 400, 409]).toContain(await probe(t, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: f.owner.cookie, body }));
      }),
      runs(815, 80),
    );
  });

  it('PATCH /api/rooms/:id/members/:userId {role}; the last owner is never demoted', async () => {
    // A room of its own: the owner may demote themself here once another member is an owner (then 403).
    const g = await roomFixture(server.url);
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(g.owner.id, g.tuner.id, g.observer.id), shapedBody({ role }), async (userId, body) => {
        expect([200, 400, 403, 404, 409]).toContain(
          await probe(t, { method: 'PATCH', path: `/api/rooms/${g.roomId}/members/${userId}`, cookie: g.owner.cookie, body }),
        );
        const owners = await server.knex('room_members').where({ room_id: g.roomId, role: 'owner' }).count({ n: '*' });
        expect(Number(owners[0].n)).toBeGreaterThanOrEqual(1);
      }),
      runs(816, 80),
    );
  });

  it('POST /api/rooms/:id/snapshots {label, forReview}', async () => {
    await fc.assert(
      fc.asyncProperty(shapedBody({ label: fc.string({ minLength: 1, maxLength: 200 }), forReview: fc.boolean() }), async (body) => {
        expect([201, 400]).toContain(await probe(t, { method: 'POST', path: `/api/rooms/${f.roomId}/snapshots`, cookie: f.owner.cookie, body }));
      }),
      runs(817, 40),
    );
  });

  it('POST /api/snapshots/:id/branch {name}', async () => {
    await fc.assert(
      fc.asyncProperty(shapedBody({ name: roomName }), async (body) => {
        expect([201, 400]).toContain(await probe(t, { method: 'POST', path: `/api/snapshots/${f.snapshotId}/branch`, cookie: f.owner.cookie, body }));
      }),
      runs(818, 40),
    );
  });

  it('POST /api/rooms/:id/collab-token ignores any body; GET /api/rooms/:id/design still reads', async () => {
    await fc.assert(
      fc.asyncProperty(rawBody, async (raw) => {
        const status = await probe(t, { ...requestWithRaw({ method: 'POST', path: `/api/rooms/${f.roomId}/collab-token` }, raw), cookie: f.owner.cookie });
        expect([200, 400, 413, 415]).toContain(status);
      }),
      runs(819, 30),
    );
    expect((await probe(t, { method: 'GET', path: `/api/rooms/${f.roomId}/design`, cookie: f.owner.cookie })).valueOf()).toBe(200);
  });
});
