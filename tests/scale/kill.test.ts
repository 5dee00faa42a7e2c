// Killing one of two Matchloom processes loses nothing: process A is killed with SIGKILL during a burst
// of edits by a client on A and a client on B. Every edit that a fresh watcher on B had received before
// the kill is in the room afterwards (on B, and in the design file), and once A is restarted a fresh
// client on A reads the same document as one on B.
import { afterAll, beforeAll, expect, it } from 'vitest';
import * as Y from 'yjs';
import { insertElement, orderedElementIds, readDesignInput, readElement, setElementField } from '../../shared/collab/schema';
import { canonicalJson, converged, docJson, prng, sleep, until, type Peer, type Person } from '../collab/helpers/world';
import { describeScale, scaleTitle, startProcess, stopAll, twoProcessRoom, untilDesign, type Process } from './helpers/cluster';

let db: string;
let A: Process;
let B: Process;
let owner: Person;
let tuner: Person;
let watcherPerson: Person;
let roomId: string;
const peers: Peer[] = [];

/** Every change in `seen` is already in `doc`: its state vector covers seen's, and merging adds nothing. */
function holdsAll(doc: Y.Doc, seen: Uint8Array): void {
  const vector = Y.decodeStateVector(Y.encodeStateVector(doc));
  for (const [client, clock] of Y.decodeStateVector(Y.encodeStateVectorFromUpdate(seen)))
    expect(vector.get(client) ?? 0, `client ${client}`).toBeGreaterThanOrEqual(clock);
  const merged = new Y.Doc();
  Y.applyUpdate(merged, Y.encodeStateAsUpdate(doc));
  Y.applyUpdate(merged, seen);
  expect(docJson(merged)).toBe(docJson(doc));
  merged.destroy();
}

/** The changes `from` has and `to` lacks, per Yjs client: `client: clock in to < clock in from`. */
function missing(from: Y.Doc, to: Y.Doc, names: Map<number, string>): string[] {
  const held = Y.decodeStateVector(Y.encodeStateVector(to));
  return [...Y.decodeStateVector(Y.encodeStateVector(from))]
    .filter(([client, clock]) => (held.get(client) ?? 0) < clock)
    .map(([client, clock]) => `${names.get(client) ?? client}: ${held.get(client) ?? 0} < ${clock}`);
}

describeScale(scaleTitle('one of two processes killed during a burst of edits'), () => {
  beforeAll(async () => {
    ({ db, A, B, owner, roomId, people: { tuner, watcherPerson } } = await twoProcessRoom(
      'kill',
      { tuner: { name: 'Tuner', role: 'tuner' }, watcherPerson: { name: 'Watcher', role: 'observer' } },
      [{ id: 'c0', kind: 'shunt-c', value: 1e-12 }],
    ));
  }, 120_000);
  afterAll(async () => {
    for (const p of peers.splice(0)) p.destroy();
    await stopAll();
  });

  it('keeps every edit the watcher on B had received, and a restarted A agrees with B', async () => {
    const a = A.api.peer(owner, roomId);
    const b = B.api.peer(tuner, roomId);
    const watcher = B.api.peer(watcherPerson, roomId);
    peers.push(a, b, watcher);
    await Promise.all([a.synced, b.synced, watcher.synced]);
    setElementField(a.doc, 'c0', 'value', 2e-12);
    await until('an edit on A to reach the watcher on B', () => readElement(watcher.doc, 'c0')?.value === 2e-12, 20_000);

    // Count what reaches the watcher from each editor (their Yjs client ids).
    let fromA = 0;
    let received = 0;
    watcher.doc.on('update', (u: Uint8Array, origin: unknown) => {
      if (origin !== watcher.provider) return;
      received++;
      if (Y.decodeUpdate(u).structs.some((s) => s.id.client === a.doc.clientID)) fromA++;
    });

    // The burst: both editors change values and add elements as fast as the event loop lets them.
    const rnd = prng(11);
    let killedAt = -1;
    let seenState: Uint8Array | null = null;
    for (let i = 0; killedAt < 0 ? i < 4000 : i < killedAt + 60; i++) {
      const p = i % 2 === 0 ? a : b;
      if (rnd() < 0.2) insertElement(p.doc, { id: `e${i}`, kind: rnd() < 0.5 ? 'series-l' : 'shunt-c', value: (1 + i) * 1e-12 });
      else {
        const ids = orderedElementIds(p.doc);
        setElementField(p.doc, ids[Math.floor(rnd() * ids.length)], 'value', (1 + i) * 1e-12);
      }
      if (i % 4 === 0) await sleep(1);
      if (killedAt < 0 && received >= 150 && fromA >= 30) {
        A.child.kill('SIGKILL');
        // What the watcher holds now is what it had received before the kill.
        seenState = Y.encodeStateAsUpdate(watcher.doc);
        killedAt = i;
      }
    }
    expect(killedAt, 'the kill happened during the burst').toBeGreaterThan(0);
    await A.exited;
    const seen = seenState!;
    const seenDoc = new Y.Doc();
    Y.applyUpdate(seenDoc, seen);
    const seenIds = readDesignInput(seenDoc).elements!.map((e) => e.id);
    expect(seenIds.length).toBeGreaterThan(1);
    const names = new Map([
      [a.doc.clientID, 'the editor on A'],
      [b.doc.clientID, 'the editor on B'],
    ]);
    a.destroy();
    b.destroy();
    watcher.destroy();

    // B, still up: a fresh client there holds everything the watcher saw, and so does B's design file.
    const onB = B.api.peer(owner, roomId);
    peers.push(onB);
    await onB.synced;
    holdsAll(onB.doc, seen);
    await untilDesign('the design file on B to hold every element the watcher saw', B.api, owner, roomId, (d) => {
      const ids = new Set(d.elements.map((e: { id: string }) => e.id));
      return seenIds.every((id) => ids.has(id));
    });

    // A restarted on the same database: a fresh client there reads what a fresh client on B reads.
    A = await startProcess('A (restarted)', db);
    const onA = A.api.peer(owner, roomId);
    const onB2 = B.api.peer(tuner, roomId);
    peers.push(onA, onB2);
    await Promise.all([onA.synced, onB2.synced]);
    holdsAll(onA.doc, seen);
    try {
      await converged([onA, onB2, onB], 20_000);
    } catch (e) {
      // Say which side lacks what (Yjs client: clock held < clock on the other side).
      expect({ missingOnB: missing(onA.doc, onB2.doc, names), missingOnA: missing(onB2.doc, onA.doc, names) }).toEqual({ missingOnB: [], missingOnA: [] });
      throw e;
    }
    expect(docJson(onA.doc)).toBe(docJson(onB2.doc));
    const designOnB = await B.api.design(owner, roomId);
    await untilDesign('the design file on A to match B', A.api, owner, roomId, (d) => canonicalJson(d) === canonicalJson(designOnB));
    seenDoc.destroy();
  }, 180_000);
});
