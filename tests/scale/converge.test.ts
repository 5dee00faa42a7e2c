// Clients on two Matchloom processes (one PostgreSQL, one Redis) edit one room at the same time: the same
// elements and different ones, seeded random edits. Every copy ends equal, presence (awareness) crosses
// the processes, and a fresh client, and the design file, read the same on either process.
import { afterAll, beforeAll, expect, it } from 'vitest';
import { insertElement, moveElement, orderedElementIds, readDesignInput, readElement, removeElement, setElementField } from '../../shared/collab/schema';
import { parseDesign } from '../../shared/rf/design';
import { canonicalJson, converged, docJson, prng, sleep, until, type Peer, type Person } from '../collab/helpers/world';
import { describeScale, scaleTitle, stopAll, twoProcessRoom, type Process } from './helpers/cluster';

let A: Process;
let B: Process;
let owner: Person;
let tuner: Person;
let second: Person;
let roomId: string;
const peers: Peer[] = [];

describeScale(scaleTitle('clients on two processes'), () => {
  beforeAll(async () => {
    ({ A, B, owner, roomId, people: { tuner, second } } = await twoProcessRoom(
      'converge',
      { tuner: { name: 'Tuner', role: 'tuner', via: 'B' }, second: { name: 'Second Tuner', role: 'tuner' } },
      [
        { id: 's0', kind: 'series-l', value: 3.3e-9 },
        { id: 's1', kind: 'shunt-c', value: 0.9e-12 },
        { id: 's2', kind: 'shunt-c', value: 1.2e-12 },
      ],
    ));
  }, 120_000);
  afterAll(async () => {
    for (const p of peers.splice(0)) p.destroy();
    await stopAll();
  });

  it('a session made on one process works on the other', async () => {
    for (const [p, who] of [[B, owner], [A, tuner]] as const)
      expect((await p.api.call(who, 'GET', '/api/me')).body).toMatchObject({ id: who.id });
    expect((await B.api.call(owner, 'GET', '/api/rooms')).body).toEqual([expect.objectContaining({ id: roomId, role: 'owner' })]);
  });

  it('concurrent seeded edits of the same and of different elements converge on both processes', async () => {
    const onA = [A.api.peer(owner, roomId), A.api.peer(second, roomId)];
    const onB = [B.api.peer(tuner, roomId), B.api.peer(owner, roomId)];
    const all = [...onA, ...onB];
    peers.push(...all);
    await Promise.all(all.map((p) => p.synced));

    // A first edit each way, so the relay is known to work before the burst.
    setElementField(onA[0].doc, 's0', 'value', 4.7e-9);
    await until('an edit on A to reach B', () => readElement(onB[0].doc, 's0')?.value === 4.7e-9, 20_000);
    setElementField(onB[0].doc, 's1', 'value', 1.5e-12);
    await until('an edit on B to reach A', () => readElement(onA[1].doc, 's1')?.value === 1.5e-12, 20_000);

    const rnd = prng(20261201);
    const own = all.map(() => [] as string[]);
    for (let i = 0; i < 600; i++) {
      const k = i % all.length;
      const doc = all[k].doc;
      const roll = rnd();
      const value = (1 + Math.floor(rnd() * 1000)) * 1e-12;
      if (roll < 0.45) {
        // The same elements: everyone writes the shared three.
        setElementField(doc, `s${Math.floor(rnd() * 3)}`, 'value', value);
      } else if (roll < 0.6 || own[k].length === 0) {
        const id = `p${k}-${i}`;
        insertElement(doc, { id, kind: rnd() < 0.5 ? 'series-l' : 'shunt-c', value }, Math.floor(rnd() * (orderedElementIds(doc).length + 1)));
        own[k].push(id);
      } else if (roll < 0.85) {
        // Different elements: each peer its own.
        setElementField(doc, own[k][Math.floor(rnd() * own[k].length)], 'value', value);
      } else if (roll < 0.93) {
        const id = own[k][Math.floor(rnd() * own[k].length)];
        if (readElement(doc, id)) moveElement(doc, id, Math.floor(rnd() * orderedElementIds(doc).length));
      } else {
        removeElement(doc, own[k].splice(Math.floor(rnd() * own[k].length), 1)[0]);
      }
      if (i % 8 === 0) await sleep(2);
    }
    await converged(all, 60_000);
    const ids = orderedElementIds(onA[0].doc);
    expect(ids.length).toBeGreaterThan(3);
    // Every peer's own surviving elements are in the merged document.
    for (const list of own) for (const id of list) expect(ids).toContain(id);
    expect(ids).toEqual(expect.arrayContaining(['s0', 's1', 's2']));

    // A fresh client on each process reads the same document.
    const freshA = A.api.peer(tuner, roomId);
    const freshB = B.api.peer(second, roomId);
    peers.push(freshA, freshB);
    await Promise.all([freshA.synced, freshB.synced]);
    await converged([onA[0], freshA, freshB], 20_000);
    expect(docJson(freshB.doc)).toBe(docJson(onB[0].doc));

    // And the design file served by either process is that document's design.
    const expected = canonicalJson(parseDesign(readDesignInput(onA[0].doc)));
    for (const p of [A, B])
      await until(`the design file on ${p.label}`, async () => canonicalJson(parseDesign(await p.api.design(owner, roomId))) === expected, 30_000);
  }, 180_000);

  it('cursor presence (awareness) set on one process is seen on the other', async () => {
    const a = A.api.peer(owner, roomId);
    const b = B.api.peer(tuner, roomId);
    peers.push(a, b);
    await Promise.all([a.synced, b.synced]);
    a.provider.awareness.setLocalStateField('cursor', { elementId: 's1' });
    b.provider.awareness.setLocalStateField('cursor', { elementId: 's2' });
    await until('A\'s cursor on B', () => (b.provider.awareness.getStates().get(a.doc.clientID) as { cursor?: unknown } | undefined)?.cursor !== undefined, 20_000);
    await until('B\'s cursor on A', () => (a.provider.awareness.getStates().get(b.doc.clientID) as { cursor?: unknown } | undefined)?.cursor !== undefined, 20_000);
    expect(b.provider.awareness.getStates().get(a.doc.clientID)).toMatchObject({ cursor: { elementId: 's1' } });
    expect(a.provider.awareness.getStates().get(b.doc.clientID)).toMatchObject({ cursor: { elementId: 's2' } });
  }, 60_000);
});
