// A hostile observer (raw y-protocols messages over ws) cannot change the room document; malformed and
// oversized messages close only the sender's socket (4400 / 4413); the server stays up, other clients are
// unaffected and the database is unchanged. Tuners' bad messages are refused the same way.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { insertElement, readElement, setElementField, writeDesign } from '../../shared/collab/schema';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';
import { designWith, startWorld, until, type Person, type World } from './helpers/world';
import { awarenessMsg, editUpdate, rawClient, syncStep1, syncStep2, updateMsg, type RawClient } from './helpers/raw';

let world: World;
let owner: Person;
let observer: Person;
let tuner: Person;
let roomId: string;

beforeAll(async () => {
  world = await startWorld();
  owner = await world.signUp('Owner');
  observer = await world.signUp('Hostile Observer');
  tuner = await world.signUp('Tuner');
  roomId = await world.createRoom(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1.2e-12 }]));
  await world.addMember(owner, roomId, observer, 'observer');
  await world.addMember(owner, roomId, tuner, 'tuner');
});
afterAll(async () => {
  await world.close();
});

async function stored(): Promise<{ updates: number; state: string; design: unknown }> {
  const knex = world.server.knex;
  const [{ n }] = await knex('room_updates').where({ room_id: roomId }).count({ n: '*' });
  const st = await knex('room_states').where({ room_id: roomId }).first('state', 'upto_id');
  return { updates: Number(n), state: `${Buffer.from(st.state).toString('base64')}@${st.upto_id}`, design: await world.design(owner, roomId) };
}

async function connect(person: Person): Promise<RawClient> {
  const c = rawClient(`${world.wsBase}/collab/${roomId}`, { cookie: person.cookie });
  await c.opened;
  // The server opens with its sync step 1; answer nothing yet, but ask for the document.
  c.send(syncStep1(new Y.Doc()));
  await until('the sync answer', () => c.received.length >= 2);
  return c;
}

/** A second, well-behaved pair of clients: an edit by one must reach the other. */
async function othersStillWork(value: number): Promise<void> {
  const a = world.peer(tuner, roomId);
  const b = world.peer(owner, roomId);
  await Promise.all([a.synced, b.synced]);
  setElementField(a.doc, 'c1', 'value', value);
  await until('the edit to reach the other client', () => readElement(b.doc, 'c1')?.value === value);
  a.destroy();
  b.destroy();
}

describe('a hostile observer', () => {
  it('gets its sync request answered with the document', async () => {
    const c = await connect(observer);
    expect(readElement(c.serverDoc(), 'c1')).toMatchObject({ kind: 'shunt-c', value: 1.2e-12 });
    c.close();
  });

  it('cannot change the document with updates or sync step 2, and stays connected', async () => {
    const before = await stored();
    const c = await connect(observer);
    const base = c.serverDoc();
    const addEvil = editUpdate(base, (d) => insertElement(d, { id: 'evil', kind: 'series-r', value: 1e6 }));
    const changeC1 = editUpdate(base, (d) => setElementField(d, 'c1', 'value', 9.9e-9));
    const wipe = editUpdate(base, (d) => writeDesign(d, designWith([])));
    c.send(updateMsg(addEvil));
    c.send(syncStep2(changeC1));
    c.send(updateMsg(wipe));
    c.send(syncStep2(Y.encodeStateAsUpdate(base)));
    // Watch from an honest client: nothing arrives, and the observer's socket is still open.
    const watcher = await connect(owner);
    await new Promise((r) => setTimeout(r, 300));
    expect(c.isOpen()).toBe(true);
    const seen = watcher.serverDoc();
    expect(readElement(seen, 'evil')).toBeUndefined();
    expect(readElement(seen, 'c1')!.value).toBe(1.2e-12);
    expect(await stored()).toEqual(before);
    c.close();
    watcher.close();
  });

  it('after a role change to tuner, the same kind of update is accepted (the drop is by role)', async () => {
    const other = await world.signUp('Promoted');
    await world.addMember(owner, roomId, other, 'observer');
    const c = await connect(other);
    const base = c.serverDoc();
    const up = editUpdate(base, (d) => setElementField(d, 'c1', 'q', 40));
    c.send(updateMsg(up));
    await new Promise((r) => setTimeout(r, 150));
    expect((await world.design(owner, roomId)).elements[0].q).toBeUndefined();
    // Its dropped update left its copy diverged: on promotion the socket is asked to reconnect (4100,
    // transient) and, reconnected, the same update is accepted.
    await world.setRole(owner, roomId, other, 'tuner');
    expect(await c.closed).toEqual({ code: COLLAB_CLOSE.resync, reason: 'you may edit again; reconnecting to resynchronise' });
    const again = await connect(other);
    again.send(syncStep2(up));
    await until('the update to be stored', async () => (await world.design(owner, roomId)).elements[0].q === 40);
    Y.applyUpdate(base, up);
    again.send(updateMsg(editUpdate(base, (d) => setElementField(d, 'c1', 'q', undefined))));
    await until('the q to be cleared', async () => (await world.design(owner, roomId)).elements[0].q === undefined);
    again.close();
  });

  const malformed: [string, Uint8Array | string][] = [
    ['random bytes', new Uint8Array([0xff, 0xfe, 0x13, 0x37, 0x00, 0x42])],
    ['an empty message', new Uint8Array([])],
    ['a truncated sync message', new Uint8Array([0])],
    ['a sync message with an unknown step', new Uint8Array([0, 7, 1, 0])],
    ['a sync step 1 with a length past the end', new Uint8Array([0, 0, 200, 1, 2])],
    ['an auth message', new Uint8Array([2, 0, 0])],
    ['an unknown message type', new Uint8Array([9, 0])],
    ['trailing bytes after a sync step 1', new Uint8Array([0, 0, 1, 0, 99])],
    ['a text frame', 'hello'],
    ['an awareness update that is not JSON', new Uint8Array([1, 6, 1, 5, 1, 2, 0x7b, 0x7b])],
  ];
  it.each(malformed)('is disconnected with 4400 for %s; the server and the others carry on', async (_name, bytes) => {
    const before = await stored();
    const c = await connect(observer);
    c.send(bytes);
    const closed = await c.closed;
    expect(closed.code).toBe(COLLAB_CLOSE.badMessage);
    expect(closed.reason).not.toBe('');
    expect(await stored()).toEqual(before);
  });

  it('is disconnected with 4413 for an oversized message, and for an oversized presence update', async () => {
    const before = await stored();
    const c = await connect(observer);
    const big = new Uint8Array(1024 * 1024 + 16);
    big.set([0, 2]);
    c.send(big);
    const closed = await c.closed;
    expect(closed.code).toBe(COLLAB_CLOSE.tooLarge);
    expect(closed.reason).toMatch(/over the 1 MiB limit/);

    const d = await connect(observer);
    d.send(awarenessMsg([{ clientId: 77, clock: 1, state: { cursor: 'x'.repeat(70_000) } }]));
    expect((await d.closed).code).toBe(COLLAB_CLOSE.tooLarge);
    expect(await stored()).toEqual(before);
  });

  it("cannot overwrite another person's presence", async () => {
    const honest = world.peer(owner, roomId);
    await honest.synced;
    honest.provider.awareness.setLocalStateField('cursor', { elementId: 'c1' });
    const c = await connect(observer);
    const id = honest.doc.clientID;
    await until('the honest presence to reach the observer', () => c.received.some((m) => m[0] === 1));
    c.send(awarenessMsg([{ clientId: id, clock: 999, state: { cursor: { elementId: 'spoofed' } } }]));
    c.send(awarenessMsg([{ clientId: 4242, clock: 1, state: { cursor: { elementId: 'mine' } } }]));
    await until('the observer presence to arrive', () => honest.provider.awareness.getStates().get(4242) !== undefined);
    expect(honest.provider.awareness.getStates().get(id)).toMatchObject({ cursor: { elementId: 'c1' } });
    expect(c.isOpen()).toBe(true);
    c.close();
    await until('the observer presence to go', () => honest.provider.awareness.getStates().get(4242) === undefined);
    honest.destroy();
  });

  it('leaves the server up and other clients unaffected after all of that', async () => {
    const health = await world.call(null, 'GET', '/api/health');
    expect(health.status).toBe(200);
    await othersStillWork(2.2e-12);
    await othersStillWork(1.2e-12);
  });
});

describe('a tuner sending bad updates', () => {
  it('is disconnected with 4400 for update bytes that do not decode, and nothing is stored', async () => {
    const before = await stored();
    const c = await connect(tuner);
    c.send(updateMsg(new Uint8Array([5, 200, 1, 7, 7, 7, 7])));
    expect((await c.closed).code).toBe(COLLAB_CLOSE.badMessage);
    expect(await stored()).toEqual(before);
  });

  it('is disconnected with 4413 when the document would pass its size limit', async () => {
    const big = await world.createRoom(owner, designWith([{ id: 'n1', kind: 'series-r', value: 50 }]));
    await world.addMember(owner, big, tuner, 'tuner');
    const c = rawClient(`${world.wsBase}/collab/${big}`, { cookie: tuner.cookie });
    await c.opened;
    c.send(syncStep1(new Y.Doc()));
    await until('the sync answer', () => c.received.length >= 2);
    const base = c.serverDoc();
    const chunk = 'z'.repeat(1000 * 1000);
    let sent = 0;
    for (let i = 0; i < 10; i++) {
      const u = editUpdate(base, (d) => setElementField(d, 'n1', `note${i}`, chunk));
      Y.applyUpdate(base, u);
      c.send(updateMsg(u));
      sent++;
    }
    const closed = await c.closed;
    expect(sent).toBe(10);
    expect(closed.code).toBe(COLLAB_CLOSE.tooLarge);
    expect(closed.reason).toMatch(/8 MiB limit/);
    // What was accepted before the limit is stored and loads.
    const rows = await world.server.knex('room_updates').where({ room_id: big }).count({ n: '*' });
    expect(Number(rows[0].n)).toBeGreaterThanOrEqual(7);
    expect(Number(rows[0].n)).toBeLessThan(10);
  });
});

describe('what the other sockets receive', () => {
  it("is exactly the bytes that were stored, and never the sender's own update back", async () => {
    const sender = await connect(tuner);
    const watcher = await connect(observer);
    const base = sender.serverDoc();
    const u = editUpdate(base, (d) => setElementField(d, 'c1', 'value', 3.3e-12));
    const sentBefore = sender.received.length;
    const seenBefore = watcher.received.length;
    sender.send(updateMsg(u));
    await until('the update to reach the observer', () => watcher.received.length > seenBefore);
    // y-websocket's update message: type 0 (sync), step 2 (update), then the update bytes.
    expect(Buffer.from(watcher.received[seenBefore])).toEqual(Buffer.from(updateMsg(u)));
    const [last] = await world.server.knex('room_updates').where({ room_id: roomId }).orderBy('id', 'desc').limit(1).select('update');
    expect(Buffer.from(last.update)).toEqual(Buffer.from(u));
    expect(readElement(watcher.serverDoc(), 'c1')?.value).toBe(3.3e-12);
    // A round trip on the sender's socket (its sync request is answered with step 2): no update came first.
    sender.send(syncStep1(base));
    await until('the sync answer', () => sender.received.slice(sentBefore).some((m) => m[0] === 0 && m[1] === 1));
    expect(sender.received.slice(sentBefore).some((m) => m[0] === 0 && m[1] === 2)).toBe(false);
    sender.close();
    watcher.close();
  });
});
