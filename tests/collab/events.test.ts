// Room events over socket.io on the real server: handshake authorisation, membership on join, the
// presence list, room log wording (and merging of rapid edits), history on join, follow mode relaying a
// view only to followers in the room, role-changed and snapshot-created events.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { io, type Socket } from 'socket.io-client';
import { insertElement, moveElement, setElementField } from '../../shared/collab/schema';
import { ROOM_EVENTS, type JoinReply, type PresencePayload, type RoomLogEntry, type ViewRelayPayload } from '../../shared/collab/events';
import { presenceColour } from '../../shared/collab/presence';
import { designWith, sleep, startWorld, until, type Person, type World } from './helpers/world';

let world: World;
let owner: Person;
let tuner: Person;
let observer: Person;
let outsider: Person;
let roomId: string;
const sockets: Socket[] = [];

beforeAll(async () => {
  world = await startWorld();
  owner = await world.signUp('Owner');
  tuner = await world.signUp('Tuner');
  observer = await world.signUp('Observer');
  outsider = await world.signUp('Outsider');
  roomId = await world.createRoom(
    owner,
    designWith([
      { id: 'l1', kind: 'series-l', value: 3.3e-9 },
      { id: 'c1', kind: 'shunt-c', value: 0.9e-12 },
      { id: 'c2', kind: 'shunt-c', value: 1.2e-12 },
    ]),
  );
  await world.addMember(owner, roomId, tuner, 'tuner');
  await world.addMember(owner, roomId, observer, 'observer');
});
afterAll(async () => {
  for (const s of sockets) s.disconnect();
  await world.close();
});

interface Client {
  socket: Socket;
  presence: PresencePayload[];
  log: RoomLogEntry[];
  views: ViewRelayPayload[];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- payloads are checked field by field
  events: { name: string; payload: any }[];
}

async function connect(person: Person | null, auth?: { token: string }): Promise<Client> {
  const socket = io(world.baseUrl, {
    path: '/socket.io',
    transports: ['websocket'],
    forceNew: true,
    reconnection: false,
    extraHeaders: person ? { cookie: person.cookie } : {},
    auth,
  });
  sockets.push(socket);
  const c: Client = { socket, presence: [], log: [], views: [], events: [] };
  socket.on(ROOM_EVENTS.presence, (p: PresencePayload) => c.presence.push(p));
  socket.on(ROOM_EVENTS.log, (e: RoomLogEntry) => c.log.push(e));
  socket.on(ROOM_EVENTS.view, (v: ViewRelayPayload) => c.views.push(v));
  socket.onAny((name: string, payload: unknown) => c.events.push({ name, payload }));
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', (e) => reject(e));
  });
  return c;
}

async function join(c: Client, id = roomId): Promise<JoinReply> {
  return (await c.socket.emitWithAck(ROOM_EVENTS.join, { roomId: id })) as JoinReply;
}

const lastPresence = (c: Client) => c.presence.at(-1)?.members ?? [];

describe('handshake and join', () => {
  it('refuses a handshake without a session or token', async () => {
    await expect(connect(null)).rejects.toThrow(/not signed in/);
    await expect(connect(null, { token: 'nonsense' })).rejects.toThrow(/invalid or has expired/);
  });

  it('lets a signed-in non-member connect but not join', async () => {
    const c = await connect(outsider);
    const reply = await join(c);
    expect(reply).toEqual({ ok: false, error: { code: 'not-a-member', message: 'you are not a member of this room' } });
    c.socket.disconnect();
  });

  it('accepts a collab token, but only for its own room', async () => {
    const other = await world.createRoom(owner);
    const c = await connect(null, { token: await world.collabToken(tuner, roomId) });
    expect(await join(c)).toMatchObject({ ok: true, role: 'tuner', userId: tuner.id });
    expect(await join(c, other)).toMatchObject({ ok: false, error: { code: 'not-a-member' } });
    c.socket.disconnect();
  });

  it('answers a malformed payload with a bad-request error', async () => {
    const c = await connect(tuner);
    const reply = await c.socket.emitWithAck(ROOM_EVENTS.join, { roomId: 42 });
    expect(reply).toMatchObject({ ok: false, error: { code: 'bad-request' } });
    const view = await c.socket.emitWithAck(ROOM_EVENTS.view, { roomId, view: { charts: { smith: { zoom: -1 } } } });
    expect(view).toMatchObject({ ok: false, error: { code: 'bad-request' } });
    c.socket.disconnect();
  });
});

describe('presence', () => {
  it('lists who is in the room with name, role and stable colour, on join and on leave', async () => {
    const a = await connect(owner);
    const joined = await join(a);
    expect(joined.ok && joined.presence).toEqual([
      { userId: owner.id, displayName: 'Owner', role: 'owner', colour: presenceColour(owner.id), following: null },
    ]);
    const b = await connect(observer);
    await join(b);
    await until('A to see B', () => lastPresence(a).length === 2);
    expect(lastPresence(a)[1]).toEqual({ userId: observer.id, displayName: 'Observer', role: 'observer', colour: presenceColour(observer.id), following: null });
    // A second tab of the same person counts once.
    const b2 = await connect(observer);
    await join(b2);
    await sleep(100);
    expect(lastPresence(a)).toHaveLength(2);
    b.socket.disconnect();
    b2.socket.disconnect();
    await until('A to see B leave', () => lastPresence(a).length === 1);
    expect(lastPresence(a)[0].userId).toBe(owner.id);
    a.socket.disconnect();
  });

  it('gives every person a colour from the palette that does not change between calls', () => {
    expect(presenceColour(owner.id)).toMatch(/^#[0-9a-f]{6}$/);
    expect(presenceColour(owner.id)).toBe(presenceColour(owner.id));
  });
});

describe('room log', () => {
  it('describes accepted edits in words, merges rapid edits of one field, and sends history on join', async () => {
    const watcher = await connect(observer);
    await join(watcher);
    const tunerDoc = world.peer(tuner, roomId);
    const ownerDoc = world.peer(owner, roomId);
    await Promise.all([tunerDoc.synced, ownerDoc.synced]);

    // Three quick edits of C2 by the tuner: one entry, from the first value to the last.
    for (const v of [1.3e-12, 1.4e-12, 1.5e-12]) {
      setElementField(tunerDoc.doc, 'c2', 'value', v);
      await sleep(40);
    }
    await until('the merged entry', () => watcher.log.some((e) => e.message === 'Tuner changed C2 from 1.2 pF to 1.5 pF'));
    const ids = new Set(watcher.log.map((e) => e.id));
    expect(ids.size).toBe(1);
    const entry = watcher.log.at(-1)!;
    expect(entry).toMatchObject({ roomId, userId: tuner.id, displayName: 'Tuner' });

    insertElement(ownerDoc.doc, { id: 'c3', kind: 'shunt-c', value: 2.2e-12 });
    await until('the add entry', () => watcher.log.some((e) => e.message === 'Owner added shunt C C3 (2.2 pF)'));
    moveElement(ownerDoc.doc, 'l1', 2);
    await until('the move entry', () => watcher.log.some((e) => e.message.startsWith('Owner moved L1 to position 3 of 4')));

    // An observer's edits are dropped, so they never reach the log.
    const obs = world.peer(observer, roomId);
    await obs.synced;
    setElementField(obs.doc, 'c1', 'value', 9e-12);
    await sleep(600); // longer than the 200 ms before an accepted edit is described
    expect(watcher.log.some((e) => e.message.includes('9 pF'))).toBe(false);

    // The merged entry's row is rewritten once the edits stop (about 2 s after the last).
    const messages = async () => (await world.server.knex('room_log').where({ room_id: roomId }).orderBy('id')).map((r) => r.message as string);
    await until('the merged row to be written', async () => (await messages())[0] === 'Tuner changed C2 from 1.2 pF to 1.5 pF', 5000);
    const rows = (await messages()).map((message) => ({ message }));
    expect(rows.map((r) => r.message)).toEqual([
      'Tuner changed C2 from 1.2 pF to 1.5 pF',
      'Owner added shunt C C3 (2.2 pF)',
      'Owner moved L1 to position 3 of 4 (from the load)',
    ]);

    const late = await connect(owner);
    const reply = await join(late);
    expect(reply.ok && reply.log.map((e) => e.message)).toEqual(rows.map((r) => r.message));
    expect(reply.ok && reply.log[0]).toMatchObject({ userId: tuner.id, displayName: 'Tuner' });
    for (const p of [tunerDoc, ownerDoc, obs]) p.destroy();
    watcher.socket.disconnect();
    late.socket.disconnect();
  });
});

describe('room log while edits go on', () => {
  it('a member joining mid-burst gets the latest wording of the entry being merged', async () => {
    const t = world.peer(tuner, roomId);
    await t.synced;
    const row = () => world.server.knex('room_log').where({ room_id: roomId }).orderBy('id', 'desc').first('message');
    setElementField(t.doc, 'l1', 'value', 5.6e-9);
    await until('the entry to be stored', async () => (await row())?.message === 'Tuner changed L1 from 3.3 nH to 5.6 nH');
    setElementField(t.doc, 'l1', 'value', 6.8e-9);
    await until('the second edit to be accepted', async () => (await world.design(owner, roomId)).elements.some((e: { value?: number }) => e.value === 6.8e-9));
    expect((await row())?.message).toBe('Tuner changed L1 from 3.3 nH to 5.6 nH'); // the row is rewritten later
    const late = await connect(observer);
    const reply = await join(late);
    expect(reply.ok && reply.log.at(-1)?.message).toBe('Tuner changed L1 from 3.3 nH to 6.8 nH');
    t.destroy();
    late.socket.disconnect();
  });
});

describe('follow mode', () => {
  it("relays a member's view to their followers in the room and to nobody else", async () => {
    const other = await world.createRoom(owner);
    const t = await connect(tuner);
    const follower = await connect(observer);
    const bystander = await connect(owner);
    const elsewhere = await connect(owner);
    await join(t);
    await join(follower);
    await join(bystander);
    expect(await join(elsewhere, other)).toMatchObject({ ok: true });

    const first = { selectedElementId: 'c2', charts: { smith: { zoom: 2, panX: 0.1, panY: -0.2 } } };
    expect(await t.socket.emitWithAck(ROOM_EVENTS.view, { roomId, view: first })).toEqual({ ok: true });
    const followReply = await follower.socket.emitWithAck(ROOM_EVENTS.follow, { roomId, userId: tuner.id });
    expect(followReply).toEqual({ ok: true, view: first }); // the current view at once
    await until('presence to show the follow', () => lastPresence(bystander).some((m) => m.userId === observer.id && m.following === tuner.id));

    const next = { selectedElementId: 'l1', charts: { band: { xRange: [2.3e9, 2.6e9] as [number, number] } } };
    await t.socket.emitWithAck(ROOM_EVENTS.view, { roomId, view: next });
    await until('the follower to get the view', () => follower.views.length === 1);
    expect(follower.views[0]).toEqual({ roomId, userId: tuner.id, view: next });
    await sleep(100);
    expect(bystander.views).toEqual([]);
    expect(elsewhere.views).toEqual([]);
    expect(t.views).toEqual([]);

    expect(await follower.socket.emitWithAck(ROOM_EVENTS.follow, { roomId, userId: null })).toEqual({ ok: true, view: null });
    await t.socket.emitWithAck(ROOM_EVENTS.view, { roomId, view: first });
    await sleep(100);
    expect(follower.views).toHaveLength(1);

    expect(await follower.socket.emitWithAck(ROOM_EVENTS.follow, { roomId, userId: outsider.id })).toMatchObject({ ok: false, error: { code: 'not-present' } });
    expect(await elsewhere.socket.emitWithAck(ROOM_EVENTS.view, { roomId, view: first })).toMatchObject({ ok: false, error: { code: 'not-joined' } });
    for (const c of [t, follower, bystander, elsewhere]) c.socket.disconnect();
  });
});

describe('role and snapshot events', () => {
  it('tells the room about role changes and removes a removed member from presence', async () => {
    const extra = await world.signUp('Extra');
    await world.addMember(owner, roomId, extra, 'observer');
    const a = await connect(owner);
    const x = await connect(extra);
    await join(a);
    await join(x);
    await until('A to see Extra', () => lastPresence(a).some((m) => m.userId === extra.id));
    await world.setRole(owner, roomId, extra, 'tuner');
    await until('role-changed', () => a.events.some((e) => e.name === ROOM_EVENTS.roleChanged && e.payload.role === 'tuner'));
    expect(a.events.find((e) => e.name === ROOM_EVENTS.roleChanged)!.payload).toEqual({ roomId, userId: extra.id, role: 'tuner' });
    await until('presence to show the new role', () => lastPresence(a).some((m) => m.userId === extra.id && m.role === 'tuner'));

    await world.removeMember(owner, roomId, extra);
    await until('the removed member to hear of it', () => x.events.some((e) => e.name === ROOM_EVENTS.roleChanged && e.payload.role === null));
    await until('presence without Extra', () => !lastPresence(a).some((m) => m.userId === extra.id));
    // No longer in the socket.io room: later room events do not reach them.
    const before = x.events.length;
    await world.call(owner, 'POST', `/api/rooms/${roomId}/snapshots`, { label: 'after removal' });
    await until('the snapshot event for A', () => a.events.some((e) => e.name === ROOM_EVENTS.snapshotCreated));
    await sleep(100);
    expect(x.events.slice(before).some((e) => e.name === ROOM_EVENTS.snapshotCreated)).toBe(false);
    const snap = a.events.find((e) => e.name === ROOM_EVENTS.snapshotCreated)!.payload;
    expect(snap.roomId).toBe(roomId);
    a.socket.disconnect();
    x.socket.disconnect();
  });
});
