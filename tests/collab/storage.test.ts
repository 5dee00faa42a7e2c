// Durable storage of room documents through the hub (shortened limits): every update is in SQLite before
// any other client sees it, the log is compacted every N updates and on unload, idle rooms unload and
// reload intact, a no-op resync stores nothing, shutdown stores everything, damaged log rows are skipped.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import Database from 'better-sqlite3';
import * as Y from 'yjs';
import { insertElement, readDesign, readElement, setElementField } from '../../shared/collab/schema';
import { loadRoomDesign, loadRoomDocument } from '../../server/collab/store';
import { designWith, sleep, until, type Person } from './helpers/world';
import { startHub, type HubWorld } from './helpers/hub';

const require = createRequire(import.meta.url);
let w: HubWorld;
let owner: Person;
let tuner: Person;

beforeAll(async () => {
  w = await startHub({ compactEvery: 10, unloadDelayMs: 150 });
  owner = await w.person('Owner');
  tuner = await w.person('Tuner');
});
afterAll(async () => {
  await w.close();
});

const rowCount = async (roomId: string) => Number((await w.knex('room_updates').where({ room_id: roomId }).count({ n: '*' }))[0].n);

describe('write before broadcast', () => {
  it('every update a client receives is already in the database', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]), [[tuner, 'tuner']]);
    const writer = w.api.peer(tuner, roomId);
    const reader = w.api.peer(owner, roomId);
    await Promise.all([writer.synced, reader.synced]);
    // A second, synchronous connection to the same file: read the stored document the instant an
    // update arrives at the reader, before anything else can run.
    const db = new Database(w.databaseFile, { readonly: true });
    const storedStateVector = () => {
      const doc = new Y.Doc();
      const st = db.prepare('select state, upto_id from room_states where room_id = ?').get(roomId) as { state: Buffer; upto_id: number };
      Y.applyUpdate(doc, st.state);
      for (const r of db.prepare('select "update" from room_updates where room_id = ? and id > ? order by id').all(roomId, st.upto_id) as { update: Buffer }[])
        Y.applyUpdate(doc, r.update);
      const sv = Y.decodeStateVector(Y.encodeStateVector(doc));
      doc.destroy();
      return sv;
    };
    // Stored may be ahead of what the reader has (a batch is written before it is sent), never behind.
    const behind: unknown[] = [];
    let seen = 0;
    reader.doc.on('update', (_u: Uint8Array, origin: unknown) => {
      if (origin !== reader.provider) return;
      seen++;
      const stored = storedStateVector();
      for (const [client, clock] of Y.decodeStateVector(Y.encodeStateVector(reader.doc)))
        if ((stored.get(client) ?? 0) < clock) behind.push({ client, clock, stored: stored.get(client) ?? 0 });
    });
    for (let i = 1; i <= 25; i++) {
      setElementField(writer.doc, 'c1', 'value', i * 1e-12);
      if (i % 5 === 0) await sleep(5);
    }
    await until('the reader to catch up', () => readElement(reader.doc, 'c1')?.value === 25e-12);
    expect(seen).toBeGreaterThan(0);
    expect(behind).toEqual([]);
    db.close();
    writer.destroy();
    reader.destroy();
  });
});

describe('a busy database', () => {
  it('updates that meet a held write lock wait for it and still arrive, in order, stored', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]), [[tuner, 'tuner']]);
    const a = w.api.peer(tuner, roomId);
    const b = w.api.peer(owner, roomId);
    await Promise.all([a.synced, b.synced]);
    // Another thread takes the write lock for 300 ms: the room's synchronous append finds it busy and
    // the batch goes the async way, behind the lock.
    const worker = new Worker(
      `const { parentPort, workerData } = require('node:worker_threads');
       const Database = require(workerData.module);
       const db = new Database(workerData.file);
       db.exec('BEGIN IMMEDIATE');
       parentPort.postMessage('locked');
       Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 300);
       db.exec('COMMIT');
       db.close();`,
      { eval: true, workerData: { file: w.databaseFile, module: require.resolve('better-sqlite3') } },
    );
    await new Promise<void>((resolve) => worker.once('message', () => resolve()));
    const seen: number[] = [];
    b.doc.on('update', () => {
      const v = readElement(b.doc, 'c1')?.value;
      if (typeof v === 'number' && seen.at(-1) !== v) seen.push(v);
    });
    for (const v of [2e-12, 3e-12, 4e-12]) setElementField(a.doc, 'c1', 'value', v);
    await until('all three to arrive', () => readElement(b.doc, 'c1')?.value === 4e-12, 8000);
    expect(seen.at(-1)).toBe(4e-12);
    expect([...seen].sort((x, y) => x - y)).toEqual(seen); // never out of order
    expect(((await loadRoomDesign(w.knex, roomId)).elements[0] as { value?: number }).value).toBe(4e-12);
    await worker.terminate();
    a.destroy();
    b.destroy();
  });
});

describe('server-side edits (hub.applyUpdate)', () => {
  it('are stored, reach every open socket and are attributed in the room log', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]), [[tuner, 'tuner']]);
    const a = w.api.peer(tuner, roomId);
    await a.synced;
    // The edit is made on a copy of the stored document, as the restore and upload routes do.
    const copy = await loadRoomDocument(w.knex, roomId);
    let update: Uint8Array | null = null;
    copy.doc.on('update', (u: Uint8Array) => (update = u));
    setElementField(copy.doc, 'c1', 'value', 6.8e-12);
    copy.doc.destroy();
    await w.hub.applyUpdate(roomId, update!, owner.id);
    // Resolved once stored: the store has it now, and the open socket gets it.
    expect(((await loadRoomDesign(w.knex, roomId)).elements[0] as { value?: number }).value).toBe(6.8e-12);
    await until('the open socket to get it', () => readElement(a.doc, 'c1')?.value === 6.8e-12);
    await until('the room log entry', async () =>
      (await w.knex('room_log').where({ room_id: roomId })).some((r) => r.message === 'Owner changed C1 from 1 pF to 6.8 pF'),
    );
    // Applying it again changes nothing and stores nothing.
    const rows = await rowCount(roomId);
    await w.hub.applyUpdate(roomId, update!, owner.id);
    expect(await rowCount(roomId)).toBe(rows);
    a.destroy();
  });

  it('refuses an update over the message limit with a 413', async () => {
    const roomId = await w.room(owner, designWith());
    await expect(w.hub.applyUpdate(roomId, new Uint8Array(2 * 1024 * 1024), owner.id)).rejects.toMatchObject({ status: 413, code: 'too-large' });
  });

  it('works on a room nobody has open (it is loaded, edited and stored)', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'l1', kind: 'series-l', value: 1e-9 }]));
    const copy = await loadRoomDocument(w.knex, roomId);
    let update: Uint8Array | null = null;
    copy.doc.on('update', (u: Uint8Array) => (update = u));
    insertElement(copy.doc, { id: 'c9', kind: 'shunt-c', value: 3.3e-12 });
    copy.doc.destroy();
    await w.hub.applyUpdate(roomId, update!, owner.id);
    expect((await loadRoomDesign(w.knex, roomId)).elements.map((e) => e.id)).toEqual(['l1', 'c9']);
  });
});

describe('a failing write', () => {
  it("closes only its own room's sockets (1011); other rooms' updates are stored", async () => {
    const gone = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
    const kept = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
    const a = w.api.peer(owner, gone);
    const b = w.api.peer(owner, kept);
    await Promise.all([a.synced, b.synced]);
    // The room disappears underneath the socket (no hub call): its next append breaks the foreign key.
    await w.knex('rooms').where({ id: gone }).delete();
    setElementField(a.doc, 'c1', 'value', 2e-12);
    setElementField(b.doc, 'c1', 'value', 3e-12);
    await until('the orphan socket to be closed', () => a.closes.some((c) => c.code === 1011));
    await until('the other room to store its edit', async () => ((await loadRoomDesign(w.knex, kept)).elements[0] as { value?: number }).value === 3e-12);
    a.destroy();
    b.destroy();
  });
});

describe('compaction and unloading', () => {
  it('compacts every N updates, and the stored design always matches the live one', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'l1', kind: 'series-l', value: 1e-9 }]));
    const p = w.api.peer(owner, roomId);
    await p.synced;
    for (let i = 0; i < 23; i++) {
      setElementField(p.doc, 'l1', 'value', (i + 2) * 1e-9);
      await sleep(2);
    }
    const last = readElement(p.doc, 'l1')!.value;
    await until('the last edit to be stored', async () => ((await loadRoomDesign(w.knex, roomId)).elements[0] as { value?: number }).value === last);
    const state = await w.knex('room_states').where({ room_id: roomId }).first('upto_id');
    expect(Number(state.upto_id)).toBeGreaterThan(0);
    expect(await rowCount(roomId)).toBeLessThan(10);
    expect(await loadRoomDesign(w.knex, roomId)).toEqual(readDesign(p.doc));
    p.destroy();
  });

  it('unloads an idle room (compacting its log) and reloads it intact', async () => {
    const roomId = await w.room(owner, designWith(), [[tuner, 'tuner']]);
    const a = w.api.peer(owner, roomId);
    const b = w.api.peer(tuner, roomId);
    await Promise.all([a.synced, b.synced]);
    insertElement(a.doc, { id: 'c7', kind: 'shunt-c', value: 4.7e-12 });
    await until('B to see the insert', () => readElement(b.doc, 'c7') !== undefined);
    const design = readDesign(a.doc);
    a.destroy();
    b.destroy();
    await until('the room to unload and compact', async () => (await rowCount(roomId)) === 0, 3000);
    expect(await loadRoomDesign(w.knex, roomId)).toEqual(design);

    const c = w.api.peer(tuner, roomId);
    await c.synced;
    expect(readDesign(c.doc)).toEqual(design);
    setElementField(c.doc, 'c7', 'value', 5.6e-12);
    await until('the edit after reload to be stored', async () => ((await loadRoomDesign(w.knex, roomId)).elements[0] as { value?: number }).value === 5.6e-12);
    c.destroy();
  });

  it('stores nothing for a reconnect that brings nothing new', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
    const p = w.api.peer(owner, roomId);
    await p.synced;
    setElementField(p.doc, 'c1', 'value', undefined); // a deletion: its delete set travels in every later sync step 2
    setElementField(p.doc, 'c1', 'q', 50);
    await until('stored', async () => (await rowCount(roomId)) === 2);
    for (let i = 0; i < 3; i++) {
      p.provider.disconnect();
      p.provider.connect();
      await until('resync', () => p.provider.synced);
    }
    await sleep(100);
    expect(await rowCount(roomId)).toBe(2);
    p.destroy();
  });
});

describe('shutdown and restart', () => {
  it('close() stores every loaded document; a new hub on the same file serves it', async () => {
    const dir = (await import('./helpers/world')).tempDir();
    const first = await startHub({ compactEvery: 1000, unloadDelayMs: 60_000 }, dir);
    const o = await first.person('Owner');
    const roomId = await first.room(o, designWith());
    const p = first.api.peer(o, roomId);
    await p.synced;
    for (let i = 0; i < 5; i++) insertElement(p.doc, { id: `e${i}`, kind: 'series-r', value: 10 + i });
    await until('stored', async () => (await first.knex('room_updates').where({ room_id: roomId }).count({ n: '*' }))[0].n === 5);
    const design = readDesign(p.doc);
    p.provider.shouldConnect = false; // the client would reconnect to a server that is going away
    await first.stop();
    p.destroy();

    const second = await startHub({}, dir);
    const check = await loadRoomDocument(second.knex, roomId);
    expect(check.pendingUpdates).toBe(0); // compacted at shutdown
    check.doc.destroy();
    const again = second.api.peer({ ...o, cookie: `ml_session=${await second.tokens.signSession(o.id)}` }, roomId);
    await again.synced;
    expect(readDesign(again.doc)).toEqual(design);
    again.destroy();
    await second.close();
  });

  it('skips a damaged log row instead of failing to load the room', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
    await w.knex('room_updates').insert({ room_id: roomId, update: Buffer.from([1, 2, 3, 250, 250]), user_id: owner.id, created_at: Date.now() });
    const loaded = await loadRoomDocument(w.knex, roomId);
    expect(loaded.skippedUpdates).toBe(1);
    expect(readElement(loaded.doc, 'c1')!.value).toBe(1e-12);
    loaded.doc.destroy();
    const p = w.api.peer(owner, roomId);
    await p.synced;
    expect(readElement(p.doc, 'c1')!.value).toBe(1e-12);
    p.destroy();
  });
});
