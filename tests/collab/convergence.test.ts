// Real y-websocket providers against the real server: concurrent edits converge, reorders keep every
// element exactly once, seeded random edit sequences from three clients converge, per-user undo, and the
// design route reflects every accepted update.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type * as Y from 'yjs';
import {
  insertElement,
  moveElement,
  orderedElementIds,
  readDesign,
  readElement,
  removeElement,
  setDesignField,
  setElementField,
} from '../../shared/collab/schema';
import { createEditOrigin, createUserUndoManager } from '../../shared/collab/undo';
import type { Element } from '../../shared/rf/design';
import { converged, designWith, docJson, prng, startWorld, until, type Peer, type Person, type World } from './helpers/world';

let world: World;
let owner: Person;
let tuner: Person;
let second: Person;

beforeAll(async () => {
  world = await startWorld();
  owner = await world.signUp('Owner');
  tuner = await world.signUp('Tuner');
  second = await world.signUp('Second Tuner');
});
afterAll(async () => {
  await world.close();
});

const chain: Element[] = [
  { id: 'l1', kind: 'series-l', value: 3.3e-9 },
  { id: 'c1', kind: 'shunt-c', value: 1.2e-12 },
  { id: 'c2', kind: 'shunt-c', value: 0.8e-12 },
  { id: 'l2', kind: 'series-l', value: 1.5e-9 },
];

async function roomWithThree(elements: Element[] = chain): Promise<{ roomId: string; peers: Peer[] }> {
  const roomId = await world.createRoom(owner, designWith(elements));
  await world.addMember(owner, roomId, tuner, 'tuner');
  await world.addMember(owner, roomId, second, 'tuner');
  const peers = [world.peer(owner, roomId), world.peer(tuner, roomId), world.peer(second, roomId)];
  await Promise.all(peers.map((p) => p.synced));
  return { roomId, peers };
}

/** Hold back each peer's outgoing updates while `fn` runs, so the edits are truly concurrent. */
async function concurrently(peers: Peer[], edits: ((doc: Y.Doc) => void)[]): Promise<void> {
  for (const p of peers) p.provider.disconnect();
  edits.forEach((edit, i) => edit(peers[i].doc));
  for (const p of peers) p.provider.connect();
  await Promise.all(peers.map((p) => until('resync', () => p.provider.synced)));
}

describe('concurrent edits', () => {
  it('two people editing different fields of the same element both keep their edit', async () => {
    const { roomId, peers } = await roomWithThree();
    await concurrently(peers.slice(0, 2), [
      (d) => setElementField(d, 'c1', 'value', 1.5e-12),
      (d) => setElementField(d, 'c1', 'q', 60),
    ]);
    await converged(peers);
    for (const p of peers) expect(readElement(p.doc, 'c1')).toMatchObject({ value: 1.5e-12, q: 60 });
    expect((await world.design(owner, roomId)).elements[1]).toMatchObject({ id: 'c1', value: 1.5e-12, q: 60 });
    peers.forEach((p) => p.destroy());
  });

  it('edits of different elements by three people all survive', async () => {
    const { roomId, peers } = await roomWithThree();
    await concurrently(peers, [
      (d) => setElementField(d, 'l1', 'value', 4.7e-9),
      (d) => setElementField(d, 'c1', 'value', 2.2e-12),
      (d) => setDesignField(d, 'goal', { minReturnLossDb: 12 }),
    ]);
    await converged(peers);
    const design = readDesign(peers[2].doc);
    expect(design.elements.map((e) => ('value' in e ? e.value : null))).toEqual([4.7e-9, 2.2e-12, 0.8e-12, 1.5e-9]);
    expect(design.goal).toEqual({ minReturnLossDb: 12 });
    expect(await world.design(owner, roomId)).toEqual(design);
    peers.forEach((p) => p.destroy());
  });

  it('the same field set by two people at once settles on one value everywhere', async () => {
    const { peers } = await roomWithThree();
    await concurrently(peers.slice(0, 2), [
      (d) => setElementField(d, 'c2', 'value', 1e-12),
      (d) => setElementField(d, 'c2', 'value', 2e-12),
    ]);
    await converged(peers);
    const v = readElement(peers[0].doc, 'c2')!.value;
    expect([1e-12, 2e-12]).toContain(v);
    for (const p of peers) expect(readElement(p.doc, 'c2')!.value).toBe(v);
    peers.forEach((p) => p.destroy());
  });

  it('concurrent reorders keep every element exactly once, in one agreed order', async () => {
    const { roomId, peers } = await roomWithThree();
    await concurrently(peers, [
      (d) => moveElement(d, 'l2', 0),
      (d) => moveElement(d, 'l1', 3),
      (d) => moveElement(d, 'c1', 0),
    ]);
    await converged(peers);
    const ids = orderedElementIds(peers[0].doc);
    expect([...ids].sort()).toEqual(['c1', 'c2', 'l1', 'l2']);
    for (const p of peers) expect(orderedElementIds(p.doc)).toEqual(ids);
    expect((await world.design(owner, roomId)).elements.map((e: Element) => e.id)).toEqual(ids);
    peers.forEach((p) => p.destroy());
  });

  it('concurrent inserts at the same place keep both elements, and a move of a removed element is harmless', async () => {
    const { peers } = await roomWithThree();
    await concurrently(peers, [
      (d) => insertElement(d, { id: 'x1', kind: 'shunt-c', value: 1e-12 }, 1),
      (d) => insertElement(d, { id: 'x2', kind: 'series-l', value: 2e-9 }, 1),
      (d) => removeElement(d, 'c2'),
    ]);
    await concurrently(peers.slice(0, 2), [(d) => moveElement(d, 'l2', 0), (d) => removeElement(d, 'l2')]);
    await converged(peers);
    const ids = orderedElementIds(peers[0].doc);
    expect([...ids].sort()).toEqual(['c1', 'l1', 'x1', 'x2']);
    expect(new Set(ids).size).toBe(ids.length);
    peers.forEach((p) => p.destroy());
  });
});

describe('seeded random edit sequences', () => {
  // Three clients, each applying a random mix of field edits, inserts, removals and moves while online,
  // with random short offline spells; the documents and the stored design must agree at the end.
  it.each([1, 2, 3])('three clients converge (seed %i)', async (seed) => {
    const { roomId, peers } = await roomWithThree();
    const rnd = prng(seed);
    let nextId = 0;
    for (let step = 0; step < 60; step++) {
      const p = peers[Math.floor(rnd() * peers.length)];
      const doc = p.doc;
      const ids = orderedElementIds(doc);
      const r = rnd();
      if (r < 0.05) {
        if (p.provider.wsconnected) p.provider.disconnect();
        else p.provider.connect();
      } else if (r < 0.45 && ids.length > 0) {
        setElementField(doc, ids[Math.floor(rnd() * ids.length)], 'value', Number((rnd() * 1e-11 + 1e-13).toPrecision(3)));
      } else if (r < 0.6) {
        insertElement(doc, { id: `r${seed}-${nextId++}`, kind: rnd() < 0.5 ? 'shunt-c' : 'series-l', value: 1e-9 }, Math.floor(rnd() * (ids.length + 1)));
      } else if (r < 0.7 && ids.length > 2) {
        removeElement(doc, ids[Math.floor(rnd() * ids.length)]);
      } else if (r < 0.9 && ids.length > 1) {
        moveElement(doc, ids[Math.floor(rnd() * ids.length)], Math.floor(rnd() * ids.length));
      } else {
        setDesignField(doc, 'referenceOhms', [50, 75, 100][Math.floor(rnd() * 3)]);
      }
      if (rnd() < 0.3) await new Promise((res) => setTimeout(res, 2));
    }
    for (const p of peers) if (!p.provider.wsconnected && !p.provider.wsconnecting) p.provider.connect();
    await converged(peers, 8000);
    const ids = orderedElementIds(peers[0].doc);
    expect(new Set(ids).size).toBe(ids.length);
    const design = readDesign(peers[0].doc);
    await until('the stored design to match', async () => JSON.stringify(await world.design(owner, roomId)) === JSON.stringify(design));
    peers.forEach((p) => p.destroy());
  });
});

describe('per-user undo', () => {
  it("undoing one person's edit leaves the other's edits in place", async () => {
    const { roomId, peers } = await roomWithThree();
    const [a, b] = peers;
    const originA = createEditOrigin(owner.id);
    const originB = createEditOrigin(tuner.id);
    const undoA = createUserUndoManager(a.doc, originA, { captureTimeoutMs: 0 });
    const undoB = createUserUndoManager(b.doc, originB, { captureTimeoutMs: 0 });

    setElementField(a.doc, 'c1', 'value', 3.3e-12, originA);
    await until('B sees A', () => readElement(b.doc, 'c1')!.value === 3.3e-12);
    setElementField(b.doc, 'l1', 'value', 6.8e-9, originB);
    insertElement(b.doc, { id: 'r9', kind: 'shunt-r', value: 1000 }, 0, originB);
    await until('A sees B', () => readElement(a.doc, 'r9') !== undefined && readElement(a.doc, 'l1')!.value === 6.8e-9);

    expect(undoA.undoStack.length).toBe(1);
    undoA.undo();
    await converged(peers);
    for (const p of peers) {
      expect(readElement(p.doc, 'c1')!.value).toBe(1.2e-12); // A's edit undone
      expect(readElement(p.doc, 'l1')!.value).toBe(6.8e-9); // B's edits kept
      expect(readElement(p.doc, 'r9')).toBeDefined();
    }
    undoB.undo(); // B's last step: the insert
    await converged(peers);
    expect(readElement(peers[2].doc, 'r9')).toBeUndefined();
    expect(readElement(peers[2].doc, 'l1')!.value).toBe(6.8e-9);
    expect((await world.design(owner, roomId)).elements.map((e: Element) => e.id)).toEqual(['l1', 'c1', 'c2', 'l2']);
    undoA.destroy();
    undoB.destroy();
    peers.forEach((p) => p.destroy());
  });
});

describe('a client that was offline', () => {
  it('sends its offline edits on reconnect and they reach the others and the store', async () => {
    const { roomId, peers } = await roomWithThree();
    const [a, b] = peers;
    a.provider.disconnect();
    setElementField(a.doc, 'l2', 'value', 10e-9);
    insertElement(a.doc, { id: 'off1', kind: 'series-c', value: 5e-12 });
    expect(readElement(b.doc, 'off1')).toBeUndefined();
    a.provider.connect();
    await until('B sees the offline edits', () => readElement(b.doc, 'off1') !== undefined);
    await converged(peers);
    expect(docJson(b.doc)).toBe(docJson(a.doc));
    expect((await world.design(owner, roomId)).elements.at(-1)).toMatchObject({ id: 'off1', value: 5e-12 });
    peers.forEach((p) => p.destroy());
  });
});
