// The WAL checkpoint thread (server/collab/store.ts): after CHECKPOINT_MIN_COMMITS appends it copies the
// log into the database file within about a poll period. Real hub, real SQLite file, real sockets.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { statSync } from 'node:fs';
import { readElement, setElementField } from '../../shared/collab/schema';
import { CHECKPOINT_MIN_COMMITS, openSyncUpdateWriter } from '../../server/collab/store';
import { designWith, sleep, until, type Person } from './helpers/world';
import { startHub, type HubWorld } from './helpers/hub';

let w: HubWorld;
let owner: Person;

beforeAll(async () => {
  w = await startHub({ compactEvery: 100_000 });
  owner = await w.person('Owner');
});
afterAll(async () => {
  await w.close();
});

describe('WAL checkpoints', () => {
  it('copy the log into the database file once enough updates have been stored', async () => {
    const roomId = await w.room(owner, designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
    const writer = w.api.peer(owner, roomId);
    const reader = w.api.peer(owner, roomId);
    await Promise.all([writer.synced, reader.synced]);
    // In WAL mode only a checkpoint writes the database file itself; the appends go to the -wal file.
    const before = statSync(w.databaseFile).mtimeMs;
    const edits = CHECKPOINT_MIN_COMMITS + 10;
    for (let i = 1; i <= edits; i++) {
      setElementField(writer.doc, 'c1', 'value', i * 1e-12);
      if (i % 50 === 0) await sleep(5);
    }
    await until('every edit to arrive', () => readElement(reader.doc, 'c1')?.value === edits * 1e-12);
    await until('a checkpoint', () => statSync(w.databaseFile).mtimeMs > before, 8000);
    expect(Number((await w.knex('room_updates').where({ room_id: roomId }).count({ n: '*' }))[0].n)).toBeGreaterThanOrEqual(edits);
    writer.destroy();
    reader.destroy();
  });

  it('are the thread\'s alone: the pooled Knex connection makes none of its own (it would fsync on the event loop)', async () => {
    // Common practice (SQLite's wal_autocheckpoint pragma: 0 turns the automatic checkpoint off).
    const rows = (await w.knex.raw('PRAGMA wal_autocheckpoint')) as { wal_autocheckpoint: number }[];
    expect(rows[0].wal_autocheckpoint).toBe(0);
    // A connection the pool makes later gets the same setting.
    const fresh = (await w.knex.client.acquireRawConnection()) as { pragma(s: string, o: { simple: true }): unknown; close(): void };
    try {
      await new Promise<void>((resolve, reject) => w.knex.client.config.pool.afterCreate(fresh, (e: Error | null) => (e ? reject(e) : resolve())));
      expect(fresh.pragma('wal_autocheckpoint', { simple: true })).toBe(0);
    } finally {
      fresh.close();
    }
    // A second writer on the same file closing does not turn them back on while the hub's still runs.
    const second = openSyncUpdateWriter(w.knex);
    second?.close();
    const after = (await w.knex.raw('PRAGMA wal_autocheckpoint')) as { wal_autocheckpoint: number }[];
    expect(after[0].wal_autocheckpoint).toBe(0);
  });
});
