// A sweep over every API route the app has (read from the app itself, so routes added later are swept
// too): hostile bodies, hostile query strings and hostile ids below the room, sent by the room's owner
// (the role that reaches the deepest checks). Never a 5xx, the error shape on every 4xx, no write on a
// refusal, and nothing planted on Object.prototype.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { roomFixture, type RoomFixture, type Account } from './helpers/fixtures';
import { expectPrototypeClean, hostileString, hostileValue, probe, runs, shapedBody, type FuzzTarget } from './helpers/fuzz';
import { encodeAny, fillPath, listApiRoutes, type ApiRoute } from './helpers/routes';

let server: TestServer;
let t: FuzzTarget;
let routes: ApiRoute[];
let people: Pick<RoomFixture, 'owner' | 'tuner' | 'observer'>;
let fixture: RoomFixture;

/** The fields each known route reads, so shaped bodies come close to valid ones. */
const FIELDS: Record<string, Record<string, fc.Arbitrary<unknown>>> = {
  'PATCH /api/me': { displayName: fc.string({ maxLength: 90 }), notifyReviews: fc.boolean(), password: fc.string(), currentPassword: fc.string() },
  'POST /api/rooms/:id/notes': {
    body: fc.string({ maxLength: 300 }),
    elementId: fc.constantFrom('el-x', 'nope', ''),
    frequencyHz: fc.oneof(fc.double(), fc.constantFrom(2.44e9, 0, -1, 1e14)),
    parentId: fc.constantFrom('NoSuchNote000000000000', ''),
  },
  'PATCH /api/rooms/:id/notes/:noteId': { body: fc.string({ maxLength: 300 }), resolved: fc.boolean() },
  'PATCH /api/snapshots/:id': { label: fc.string({ maxLength: 210 }), forReview: fc.boolean() },
  'POST /api/rooms/:id/snapshots/:snapshotId/restore': {},
  'POST /api/rooms/:id/uploads/:uploadId/use': { as: fc.constantFrom('load', 'element', 'two-port', 'x'), elementId: fc.string({ maxLength: 120 }) },
  'POST /api/invitations/:token/accept': {},
};

const query = fc
  .array(fc.tuple(fc.constantFrom('a', 'b', 'series', 'format', 'a[]', 'b[x]', '__proto__[polluted]', 'constructor[prototype][polluted]', 'limit'), fc.oneof(hostileString, fc.constantFrom('live', 'yes'))), { maxLength: 4 })
  .map((pairs) => (pairs.length ? `?${pairs.map(([k, v]) => `${encodeAny(k).replace(/%5B/g, '[').replace(/%5D/g, ']')}=${encodeAny(v)}`).join('&')}` : ''));

const subId = fc.oneof(
  fc.constantFrom('NoSuchThing00000000000', '..', '%2e%2e', 'a'.repeat(70), '%00', "'or'1'='1", 'bom.csv', 'lines.csv', 'network.s2p', 'report.pdf', '..%2fpackage.json', 'bom.csv%00.pdf'),
  hostileString.filter((s) => s.length > 0 && s.length < 300),
);

async function freshFixture(): Promise<RoomFixture> {
  return roomFixture(server.url, people);
}

/** The fixture room still exists with its three members (a DELETE or role change may have spent it). */
async function fixtureIntact(f: RoomFixture): Promise<boolean> {
  const rows = (await server.knex('room_members').where({ room_id: f.roomId }).select('user_id', 'role')) as { user_id: string; role: string }[];
  const roleOf = (a: Account) => rows.find((r) => r.user_id === a.id)?.role;
  return roleOf(f.owner) === 'owner' && roleOf(f.tuner) === 'tuner' && roleOf(f.observer) === 'observer';
}

beforeAll(async () => {
  server = await startTestServer();
  t = { baseUrl: server.url, knex: server.knex };
  routes = await listApiRoutes();
  fixture = await roomFixture(server.url);
  people = { owner: fixture.owner, tuner: fixture.tuner, observer: fixture.observer };
});
afterAll(async () => {
  await server.close();
  expectPrototypeClean();
});

function runsFor(r: ApiRoute): number {
  if (r.method === 'DELETE' && r.path === '/api/rooms/:id') return 4;
  if (/handoff|exports|compare|lineage/.test(r.path)) return 6;
  if (r.method === 'GET') return 10;
  return 25;
}

describe('every route, as the owner of a room', () => {
  it('hostile bodies, queries and sub-ids: never a 5xx, a clean 4xx, no write on refusal', async () => {
    let seed = 700;
    const swept: string[] = [];
    for (const r of routes) {
      const k = `${r.method} ${r.path}`;
      const body = FIELDS[k] ? shapedBody(FIELDS[k]) : hostileValue;
      const subParams = r.params.filter((p) => p !== 'id');
      const arb = fc.record({ body, query, sub: fc.array(fc.oneof(subId, fc.constant('real')), { minLength: subParams.length, maxLength: subParams.length }) });
      await fc.assert(
        fc.asyncProperty(arb, async ({ body: b, query: q, sub }) => {
          if (!(await fixtureIntact(fixture))) fixture = await freshFixture();
          const values: Record<string, string> = { id: r.path.startsWith('/api/snapshots/') ? fixture.snapshotId : fixture.roomId };
          subParams.forEach((p, i) => {
            const real: Record<string, string> = { snapshotId: fixture.snapshotId, userId: fixture.tuner.id, file: 'bom.csv' };
            // fillPath percent-encodes every value, so any string makes a well-formed path.
            values[p] = sub[i] === 'real' ? (real[p] ?? 'NoSuchThing00000000000') : sub[i];
          });
          const path = fillPath(r.path, values) + q;
          await probe(t, { method: r.method, path, cookie: fixture.owner.cookie, body: r.method === 'GET' ? undefined : b });
        }),
        runs(seed++, runsFor(r)),
      );
      swept.push(k);
    }
    expect(swept.length).toBe(routes.length);
  }, 240_000);
});

