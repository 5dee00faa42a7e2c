// Room events (socket.io on @socket.io/redis-adapter) across two Matchloom processes: the presence list
// of a room is everyone connected to either process, and an edit made through one process is in the
// room log a client of the other receives.
import { afterAll, beforeAll, expect, it } from 'vitest';
import { setElementField } from '../../shared/collab/schema';
import { sleep, until, type Peer, type Person } from '../collab/helpers/world';
import { connectEvents, describeScale, scaleTitle, stopAll, twoProcessRoom, type EventClient, type Process } from './helpers/cluster';

let A: Process;
let B: Process;
let owner: Person;
let tuner: Person;
let observer: Person;
let roomId: string;
const peers: Peer[] = [];
const clients: EventClient[] = [];

async function client(p: Process, who: Person): Promise<EventClient> {
  const c = await connectEvents(p.api, who);
  clients.push(c);
  return c;
}

describeScale(scaleTitle('room events across two processes'), () => {
  beforeAll(async () => {
    ({ A, B, owner, roomId, people: { tuner, observer } } = await twoProcessRoom(
      'events',
      { tuner: { name: 'Tuner', role: 'tuner' }, observer: { name: 'Observer', role: 'observer' } },
      [
        { id: 'l1', kind: 'series-l', value: 3.3e-9 },
        { id: 'c1', kind: 'shunt-c', value: 1.2e-12 },
      ],
    ));
  }, 120_000);
  afterAll(async () => {
    for (const p of peers.splice(0)) p.destroy();
    for (const c of clients.splice(0)) c.close();
    await stopAll();
  });

  it('presence on B includes a member connected through A, and drops them when they leave', async () => {
    const onA = await client(A, owner);
    expect(await onA.join(roomId)).toMatchObject({ ok: true, role: 'owner' });
    const onB = await client(B, tuner);
    const reply = await onB.join(roomId);
    expect(reply).toMatchObject({ ok: true, role: 'tuner' });
    await until('B to list the owner connected through A', () => onB.members(roomId).includes(owner.id), 20_000);
    expect(onB.members(roomId).sort()).toEqual([owner.id, tuner.id].sort());
    await until('A to list the tuner connected through B', () => onA.members(roomId).includes(tuner.id), 20_000);
    expect(onA.members(roomId).sort()).toEqual([owner.id, tuner.id].sort());
    const entry = onB.presence.at(-1)!.members.find((m) => m.userId === owner.id);
    expect(entry).toMatchObject({ displayName: 'Owner', role: 'owner' });

    onA.close();
    await until('B to drop the owner who left A', () => !onB.members(roomId).includes(owner.id), 20_000);
    expect(onB.members(roomId)).toEqual([tuner.id]);
    onB.close();
  }, 60_000);

  it('a client on B gets the room log entry for an edit made on A, and a later join on B lists it', async () => {
    const watcher = await client(B, observer);
    expect(await watcher.join(roomId)).toMatchObject({ ok: true, role: 'observer' });
    const t = A.api.peer(tuner, roomId);
    peers.push(t);
    await t.synced;
    setElementField(t.doc, 'c1', 'value', 1.5e-12);
    const message = 'Tuner changed C1 from 1.2 pF to 1.5 pF';
    await until('the room log entry on B', () => watcher.log.some((e) => e.message === message), 20_000);
    expect(watcher.log.find((e) => e.message === message)).toMatchObject({ roomId, userId: tuner.id, displayName: 'Tuner' });

    await until(
      'a join on B to list the entry',
      async () => {
        const late = await client(B, owner);
        const r = await late.join(roomId);
        late.close();
        if (!(r.ok && r.log.some((e) => e.message === message))) await sleep(200);
        return r.ok && r.log.some((e) => e.message === message);
      },
      20_000,
    );
  }, 60_000);
});
