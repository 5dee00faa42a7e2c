// Presence (awareness) on the room socket is sent in batches: many people's cursor changes or renewals
// arriving together reach each socket as a few messages carrying all of them, not one message per person;
// a leave is sent too. Raw clients over real sockets against the real server.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import type { WebsocketProvider } from 'y-websocket';
import * as decoding from 'lib0/decoding';
import { designWith, startWorld, until, type Person, type World } from './helpers/world';
import { awarenessMsg, rawClient, syncStep1, type RawClient } from './helpers/raw';
import { sendOwnPresenceOnly } from '../../client/features/workspace/collab/own-presence';

let world: World;
let owner: Person;
let roomId: string;
const clients: RawClient[] = [];

beforeAll(async () => {
  world = await startWorld();
  owner = await world.signUp('Owner');
  roomId = await world.createRoom(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1.2e-12 }]));
});
afterAll(async () => {
  for (const c of clients) c.close();
  await world.close();
});

async function connect(): Promise<RawClient> {
  const c = rawClient(`${world.wsBase}/collab/${roomId}`, { cookie: owner.cookie });
  clients.push(c);
  await c.opened;
  c.send(syncStep1(new Y.Doc()));
  await until('the sync answer', () => c.received.length >= 2);
  return c;
}

/** The awareness messages a client received: each one's entries (client id, clock, state). */
function awarenessReceived(c: RawClient): { clientId: number; clock: number; state: unknown }[][] {
  const out: { clientId: number; clock: number; state: unknown }[][] = [];
  for (const m of c.received) {
    const d = decoding.createDecoder(m);
    if (decoding.readVarUint(d) !== 1) continue;
    const inner = decoding.createDecoder(decoding.readVarUint8Array(d));
    const n = decoding.readVarUint(inner);
    const entries = [];
    for (let i = 0; i < n; i++)
      entries.push({ clientId: decoding.readVarUint(inner), clock: decoding.readVarUint(inner), state: JSON.parse(decoding.readVarString(inner)) as unknown });
    out.push(entries);
  }
  return out;
}

/** The latest clock and state of each client id, as `c` has heard them. */
function latest(c: RawClient): Map<number, { clock: number; state: unknown }> {
  const m = new Map<number, { clock: number; state: unknown }>();
  for (const msg of awarenessReceived(c)) for (const e of msg) if ((m.get(e.clientId)?.clock ?? -1) <= e.clock) m.set(e.clientId, e);
  return m;
}

describe('presence batching', () => {
  it('sends eight people’s changes, then their renewals, in fewer messages than people, and a leave', async () => {
    const watcher = await connect();
    const people = await Promise.all(Array.from({ length: 8 }, () => connect()));
    const ids = people.map((_, i) => 5000 + i);
    const before = awarenessReceived(watcher).length;

    // Everyone moves their cursor at once.
    people.forEach((p, i) => p.send(awarenessMsg([{ clientId: ids[i], clock: 1, state: { cursor: { elementId: 'c1', at: i } } }])));
    await until('all eight cursors', () => ids.every((id) => latest(watcher).get(id)?.clock === 1));
    const afterChanges = awarenessReceived(watcher).length;
    expect(afterChanges - before).toBeLessThan(8);
    expect(latest(watcher).get(ids[3])?.state).toEqual({ cursor: { elementId: 'c1', at: 3 } });

    // Everyone renews (same state, newer clock), as clients do every 15 s.
    people.forEach((p, i) => p.send(awarenessMsg([{ clientId: ids[i], clock: 2, state: { cursor: { elementId: 'c1', at: i } } }])));
    await until('all eight renewals', () => ids.every((id) => latest(watcher).get(id)?.clock === 2), 5000);
    expect(awarenessReceived(watcher).length - afterChanges).toBeLessThan(8);
    // The sender hears its own renewal too (a client counts 30 s of silence as a dead link).
    await until('the sender’s own renewal', () => latest(people[0]).get(ids[0])?.clock === 2);

    // One leaves: the others are told its state is gone.
    people[7].close();
    await until('the leave', () => latest(watcher).get(ids[7])?.state === null);
  });
});

describe('the workspace provider (sendOwnPresenceOnly)', () => {
  /** Count the presence messages (y-websocket message type 1) a provider sends from now on. */
  function countPresenceSent(provider: WebsocketProvider): () => number {
    const ws = provider.ws as unknown as { send(data: Uint8Array): void };
    const send = ws.send.bind(ws);
    let n = 0;
    ws.send = (data: Uint8Array) => {
      if (decoding.readVarUint(decoding.createDecoder(new Uint8Array(data))) === 1) n++;
      send(data);
    };
    return () => n;
  }

  it('sends its own presence changes and not everyone else\'s back (the plain y-websocket client echoes them)', async () => {
    // Common practice (y-protocols awareness: a client speaks for its own client id).
    const patched = world.peer(owner, roomId);
    sendOwnPresenceOnly(patched.provider);
    const plain = world.peer(owner, roomId);
    const mover = world.peer(owner, roomId);
    try {
      await Promise.all([patched.synced, plain.synced, mover.synced]);
      const all = [patched, plain, mover];
      // (A state at clock 0, a provider's empty first one, is not taken by others: each says who it is.)
      all.forEach((p, i) => p.provider.awareness.setLocalStateField('name', `peer ${i}`));
      await until('everyone to see everyone', () => all.every((p) => all.every((q) => p.provider.awareness.getStates().has(q.provider.awareness.clientID))));
      const sentByPatched = countPresenceSent(patched.provider);
      const sentByPlain = countPresenceSent(plain.provider);
      for (let i = 1; i <= 5; i++) mover.provider.awareness.setLocalStateField('cursor', { x: i, y: i });
      const moved = (p: typeof patched) => (p.provider.awareness.getStates().get(mover.provider.awareness.clientID) as { cursor?: { x: number } } | undefined)?.cursor?.x === 5;
      await until('the last move to reach both', () => moved(patched) && moved(plain));
      expect(sentByPlain()).toBeGreaterThan(0); // the echo this guards against
      expect(sentByPatched()).toBe(0);
      // Its own changes still go out, and the others see them.
      patched.provider.awareness.setLocalStateField('cursor', { x: 42, y: 0 });
      await until('the patched client\'s own move to reach the others', () =>
        [plain, mover].every((p) => (p.provider.awareness.getStates().get(patched.provider.awareness.clientID) as { cursor?: { x: number } } | undefined)?.cursor?.x === 42),
      );
      expect(sentByPatched()).toBe(1);
    } finally {
      for (const p of [patched, plain, mover]) p.destroy();
    }
  });
});
