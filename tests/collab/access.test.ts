// Who may open a room socket: a bad, expired or other-room token and a missing session close with 4401, a
// non-member with 4403, and the real y-websocket client stops there (no reconnect loop). Role changes and
// removals through the members routes take effect at once on open sockets.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SignJWT } from 'jose';
import { COLLAB_AUDIENCE, SESSION_AUDIENCE, TOKEN_ISSUER } from '../../server/auth/tokens';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';
import { readElement, setElementField } from '../../shared/collab/schema';
import { designWith, sleep, startWorld, until, type Peer, type Person, type World } from './helpers/world';

let world: World;
let owner: Person;
let tuner: Person;
let stranger: Person;
let roomId: string;
let otherRoomId: string;

beforeAll(async () => {
  world = await startWorld();
  owner = await world.signUp('Owner');
  tuner = await world.signUp('Tuner');
  stranger = await world.signUp('Stranger');
  roomId = await world.createRoom(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
  otherRoomId = await world.createRoom(owner);
  await world.addMember(owner, roomId, tuner, 'tuner');
  await world.addMember(owner, otherRoomId, tuner, 'tuner');
});
afterAll(async () => {
  await world.close();
});

async function expectFinalClose(peer: Peer, code: number, reason: RegExp): Promise<void> {
  const closed = await peer.finalClose;
  expect(closed.code).toBe(code);
  expect(closed.reason).toMatch(reason);
  // The client must not try again: its first retry would come 200 ms after the close.
  await sleep(500);
  expect(peer.attempts()).toBe(1);
  expect(peer.provider.wsconnected).toBe(false);
  expect(peer.provider.shouldConnect).toBe(false);
  peer.destroy();
}

const signed = (claims: Record<string, unknown>, audience: string, sub: string, expSeconds: number) =>
  new SignJWT(claims)
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(sub)
    .setIssuer(TOKEN_ISSUER)
    .setAudience(audience)
    .setIssuedAt(Math.floor(Date.now() / 1000) - 120)
    .setExpirationTime(Math.floor(Date.now() / 1000) + expSeconds)
    .sign(world.config.jwtSecret);

describe('refused at the upgrade', () => {
  it('no cookie and no token: 4401 and no reconnect loop', async () => {
    await expectFinalClose(world.peer(null, roomId), COLLAB_CLOSE.unauthenticated, /not signed in/);
  });

  it('a token that is not a token: 4401', async () => {
    await expectFinalClose(world.peer(tuner, roomId, { token: 'not-a-jwt' }), COLLAB_CLOSE.unauthenticated, /invalid or has expired/);
  });

  it('an expired collab token: 4401', async () => {
    const token = await signed({ room: roomId, role: 'tuner' }, COLLAB_AUDIENCE, tuner.id, -10);
    await expectFinalClose(world.peer(tuner, roomId, { token }), COLLAB_CLOSE.unauthenticated, /invalid or has expired/);
  });

  it('a collab token signed with another secret: 4401', async () => {
    const token = await new SignJWT({ room: roomId, role: 'owner' })
      .setProtectedHeader({ alg: 'HS256' })
      .setSubject(stranger.id)
      .setIssuer(TOKEN_ISSUER)
      .setAudience(COLLAB_AUDIENCE)
      .setExpirationTime('60s')
      .sign(new TextEncoder().encode('another-secret-another-secret-another'));
    await expectFinalClose(world.peer(stranger, roomId, { token }), COLLAB_CLOSE.unauthenticated, /invalid/);
  });

  it("a collab token for another room: 4401", async () => {
    const token = await world.collabToken(tuner, otherRoomId);
    await expectFinalClose(world.peer(tuner, roomId, { token }), COLLAB_CLOSE.unauthenticated, /another room/);
  });

  it('an expired session cookie: 4401', async () => {
    const token = await signed({}, SESSION_AUDIENCE, tuner.id, -10);
    const peer = world.peer({ ...tuner, cookie: `ml_session=${token}` }, roomId);
    await expectFinalClose(peer, COLLAB_CLOSE.unauthenticated, /session is invalid or has expired/);
  });

  it('the session cookie sent from another site: 4401', async () => {
    const peer = world.peer(tuner, roomId, { headers: { origin: 'https://elsewhere.example' } });
    await expectFinalClose(peer, COLLAB_CLOSE.unauthenticated, /another site/);
  });

  it('a signed-in non-member: 4403 and no reconnect loop', async () => {
    await expectFinalClose(world.peer(stranger, roomId), COLLAB_CLOSE.forbidden, /not a member/);
  });

  it('a room that does not exist: 4403 (its existence is not revealed)', async () => {
    await expectFinalClose(world.peer(owner, 'no-such-room-0000000000'), COLLAB_CLOSE.forbidden, /not a member/);
  });

  it('a collab token whose holder was removed since: 4403', async () => {
    const leaver = await world.signUp('Leaver');
    await world.addMember(owner, roomId, leaver, 'tuner');
    const token = await world.collabToken(leaver, roomId);
    await world.removeMember(owner, roomId, leaver);
    await expectFinalClose(world.peer(leaver, roomId, { token }), COLLAB_CLOSE.forbidden, /not a member/);
  });
});

describe('accepted', () => {
  it('by session cookie and by collab token; both sync the document', async () => {
    const byCookie = world.peer(tuner, roomId);
    const byToken = world.peer(null, roomId, { token: await world.collabToken(tuner, roomId) });
    await Promise.all([byCookie.synced, byToken.synced]);
    expect(readElement(byCookie.doc, 'c1')!.value).toBe(1e-12);
    expect(readElement(byToken.doc, 'c1')!.value).toBe(1e-12);
    byCookie.destroy();
    byToken.destroy();
  });
});

describe('role changes on open sockets', () => {
  it("a demoted tuner's next update is dropped; promoted again, edits flow", async () => {
    const t = world.peer(tuner, roomId);
    const o = world.peer(owner, roomId);
    await Promise.all([t.synced, o.synced]);
    setElementField(t.doc, 'c1', 'value', 2e-12);
    await until('the tuner edit to arrive', () => readElement(o.doc, 'c1')!.value === 2e-12);

    await world.setRole(owner, roomId, tuner, 'observer');
    setElementField(t.doc, 'c1', 'value', 3e-12);
    await sleep(300);
    expect(readElement(o.doc, 'c1')!.value).toBe(2e-12);
    expect((await world.design(owner, roomId)).elements[0].value).toBe(2e-12);
    expect(t.provider.wsconnected).toBe(true); // still watching, still connected

    // Its dropped edit left its copy diverged: promoted again, it is asked to reconnect (transient 4100)
    // and resynchronises, so its next edit reaches everyone instead of waiting on the dropped one.
    await world.setRole(owner, roomId, tuner, 'tuner');
    await until('the resync reconnect', () => t.closes.some((c) => c.code === COLLAB_CLOSE.resync) && t.provider.synced);
    setElementField(t.doc, 'c1', 'value', 4e-12);
    await until('the edit after promotion to arrive', () => readElement(o.doc, 'c1')!.value === 4e-12);
    expect((await world.design(owner, roomId)).elements[0].value).toBe(4e-12);
    expect(t.attempts()).toBe(2);
    t.destroy();
    o.destroy();
  });

  it('a removed member is disconnected with 4403 and does not reconnect', async () => {
    const gone = await world.signUp('Soon Gone');
    await world.addMember(owner, roomId, gone, 'tuner');
    const p = world.peer(gone, roomId);
    await p.synced;
    await world.removeMember(owner, roomId, gone);
    const closed = await p.finalClose;
    expect(closed).toEqual({ code: COLLAB_CLOSE.forbidden, reason: 'you were removed from this room' });
    await sleep(500);
    expect(p.attempts()).toBe(1);
    p.destroy();
  });

  it('a deleted room disconnects everyone in it with 4404', async () => {
    const doomed = await world.createRoom(owner);
    await world.addMember(owner, doomed, tuner, 'tuner');
    const a = world.peer(owner, doomed);
    const b = world.peer(tuner, doomed);
    await Promise.all([a.synced, b.synced]);
    const r = await world.call(owner, 'DELETE', `/api/rooms/${doomed}`);
    expect(r.status).toBe(204);
    expect((await a.finalClose).code).toBe(COLLAB_CLOSE.roomGone);
    expect((await b.finalClose).code).toBe(COLLAB_CLOSE.roomGone);
    a.destroy();
    b.destroy();
  });
});
