// Roles hold across two Matchloom processes (one PostgreSQL, one Redis): a role change, a removal or a
// room deletion made through process A takes effect on sockets open on process B.
import { afterAll, beforeAll, expect, it } from 'vitest';
import * as Y from 'yjs';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';
import { insertElement, readElement, setElementField, writeDesign } from '../../shared/collab/schema';
import { designWith, sleep, until, type Peer, type Person } from '../collab/helpers/world';
import { editUpdate, rawClient, syncStep1, syncStep2, updateMsg, type RawClient } from '../collab/helpers/raw';
import { connectEvents, describeScale, scaleTitle, stopAll, twoProcessRoom, untilDesign, type EventClient, type Process } from './helpers/cluster';

let A: Process;
let B: Process;
let owner: Person;
let tuner: Person;
let helper: Person;
let observer: Person;
let roomId: string;
const peers: Peer[] = [];
const raws: RawClient[] = [];
const events: EventClient[] = [];

const value = (p: Peer, id: string) => readElement(p.doc, id)?.value;
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- the design file as JSON
const elementValue = (design: any, id: string) => design.elements.find((e: { id: string }) => e.id === id)?.value;

describeScale(scaleTitle('roles across two processes'), () => {
  beforeAll(async () => {
    ({ A, B, owner, roomId, people: { tuner, helper, observer } } = await twoProcessRoom(
      'roles',
      { tuner: { name: 'Tuner', role: 'tuner' }, helper: { name: 'Helper', role: 'tuner' }, observer: { name: 'Observer', role: 'observer' } },
      [
        { id: 'l1', kind: 'series-l', value: 3.3e-9 },
        { id: 'c1', kind: 'shunt-c', value: 1.2e-12 },
        { id: 'c2', kind: 'shunt-c', value: 0.9e-12 },
      ],
    ));
  }, 120_000);
  afterAll(async () => {
    for (const p of peers.splice(0)) p.destroy();
    for (const r of raws.splice(0)) r.close();
    for (const e of events.splice(0)) e.close();
    await stopAll();
  });

  it("a tuner on B demoted through A: its next edit reaches no one on A, nor the stored design", async () => {
    const t = B.api.peer(tuner, roomId);
    const h = B.api.peer(helper, roomId);
    const o = A.api.peer(owner, roomId);
    peers.push(t, h, o);
    await Promise.all([t.synced, h.synced, o.synced]);
    const tunerEvents = await connectEvents(B.api, tuner);
    events.push(tunerEvents);
    expect(await tunerEvents.join(roomId)).toMatchObject({ ok: true, role: 'tuner' });

    setElementField(t.doc, 'c1', 'value', 2e-12);
    await until('the tuner edit on B to reach A', () => value(o, 'c1') === 2e-12, 20_000);

    await A.api.setRole(owner, roomId, tuner, 'observer');
    // The change has reached B once B's socket.io delivers role-changed to the tuner there.
    await until('role-changed on B', () => tunerEvents.roleChanges.some((e) => e.userId === tuner.id && e.role === 'observer'), 20_000);
    await sleep(300);
    setElementField(t.doc, 'c1', 'value', 3e-12);
    // A later edit by another tuner on B: once it is on A (and stored), the dropped one would have been too.
    await sleep(100);
    setElementField(h.doc, 'c2', 'value', 4.7e-12);
    await until("the helper's later edit to reach A", () => value(o, 'c2') === 4.7e-12, 20_000);
    for (const p of [A, B]) await untilDesign(`the helper's edit in the design on ${p.label}`, p.api, owner, roomId, (d) => elementValue(d, 'c2') === 4.7e-12);
    await sleep(300);
    expect(value(o, 'c1')).toBe(2e-12);
    for (const p of [A, B]) expect(elementValue(await p.api.design(owner, roomId), 'c1')).toBe(2e-12);
    const fresh = A.api.peer(owner, roomId);
    peers.push(fresh);
    await fresh.synced;
    expect(value(fresh, 'c2')).toBe(4.7e-12);
    expect(value(fresh, 'c1')).toBe(2e-12);
    expect(t.provider.wsconnected).toBe(true); // still watching
  }, 120_000);

  it('an observer on B cannot change anything with hostile raw updates', async () => {
    const before = await A.api.design(owner, roomId);
    const c = rawClient(`${B.api.wsBase}/collab/${roomId}`, { cookie: observer.cookie });
    raws.push(c);
    await c.opened;
    c.send(syncStep1(new Y.Doc()));
    await until('the sync answer', () => c.received.length >= 2, 20_000);
    const base = c.serverDoc();
    expect(readElement(base, 'c1')).toMatchObject({ kind: 'shunt-c' });
    c.send(updateMsg(editUpdate(base, (d) => insertElement(d, { id: 'evil', kind: 'series-r', value: 1e6 }))));
    c.send(syncStep2(editUpdate(base, (d) => setElementField(d, 'l1', 'value', 9.9e-6))));
    c.send(updateMsg(editUpdate(base, (d) => writeDesign(d, designWith([])))));

    // A later edit by a tuner on B, seen on A: the observer's updates, sent before it, were dropped.
    const h = B.api.peer(helper, roomId);
    const o = A.api.peer(owner, roomId);
    peers.push(h, o);
    await Promise.all([h.synced, o.synced]);
    setElementField(h.doc, 'c2', 'value', 5.6e-12);
    await until("the helper's edit to reach A", () => value(o, 'c2') === 5.6e-12, 20_000);
    await untilDesign("the helper's edit in the design on A", A.api, owner, roomId, (d) => elementValue(d, 'c2') === 5.6e-12);
    await sleep(300);
    expect(readElement(o.doc, 'evil')).toBeUndefined();
    expect(value(o, 'l1')).toBe(elementValue(before, 'l1'));
    for (const p of [A, B]) {
      const after = await p.api.design(owner, roomId);
      expect(after.elements.map((e: { id: string }) => e.id)).toEqual(before.elements.map((e: { id: string }) => e.id));
      expect(elementValue(after, 'l1')).toBe(elementValue(before, 'l1'));
    }
    expect(c.isOpen()).toBe(true);
  }, 120_000);

  it('a member removed through A is disconnected on B with 4403 and does not reconnect', async () => {
    const gone = await A.api.signUp('Soon Gone');
    await A.api.addMember(owner, roomId, gone, 'tuner');
    const p = B.api.peer(gone, roomId);
    peers.push(p);
    await p.synced;
    await A.api.removeMember(owner, roomId, gone);
    await until('the 4403 close on B', () => p.closes.some((c) => c.code === COLLAB_CLOSE.forbidden), 20_000);
    expect(await p.finalClose).toEqual({ code: COLLAB_CLOSE.forbidden, reason: 'you were removed from this room' });
    await sleep(500);
    expect(p.attempts()).toBe(1);
  }, 60_000);

  it('a room deleted through A closes its sockets on B with 4404', async () => {
    const doomed = await A.api.createRoom(owner);
    await A.api.addMember(owner, doomed, tuner, 'tuner');
    const a = A.api.peer(owner, doomed);
    const b = B.api.peer(tuner, doomed);
    peers.push(a, b);
    await Promise.all([a.synced, b.synced]);
    expect((await A.api.call(owner, 'DELETE', `/api/rooms/${doomed}`)).status).toBe(204);
    await until('the 4404 close on B', () => b.closes.some((c) => c.code === COLLAB_CLOSE.roomGone), 20_000);
    expect((await a.finalClose).code).toBe(COLLAB_CLOSE.roomGone);
  }, 60_000);
});
