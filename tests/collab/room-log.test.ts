// The room log writer over a real migrated SQLite file, with its synchronous rows on a second connection
// (as the hub wires it): entries written at once when the database is free, through Knex, in order, when
// another connection holds the write lock, and never reordered between the two paths.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { pino } from 'pino';
import type { Knex } from 'knex';
import { createKnex, migrateLatest } from '../../server/db';
import { DEFAULT_LIMITS } from '../../server/collab/limits';
import { RoomLogWriter } from '../../server/collab/room-log';
import { openSyncUpdateWriter, type SyncUpdateWriter } from '../../server/collab/store';
import type { DesignChange } from '../../shared/collab/describe';
import type { RoomLogEntry } from '../../shared/collab/events';
import { tempDir } from './helpers/world';

const require = createRequire(import.meta.url);
const dir = tempDir();
const file = join(dir, 'log.sqlite3');
let knex: Knex;
let rows: SyncUpdateWriter;

const relabel = (id: string, from: string, to: string): DesignChange => ({
  type: 'element-field',
  key: `element:${id}:label`,
  elementId: id,
  field: 'label',
  subject: to,
  subjectBefore: from,
  elementKind: 'shunt-c',
  from,
  to,
});

/** Another connection holds the write lock for `ms`; resolves once it has it. */
async function holdWriteLock(ms: number): Promise<Worker> {
  const worker = new Worker(
    `const { parentPort, workerData } = require('node:worker_threads');
     const Database = require(workerData.module);
     const db = new Database(workerData.file);
     db.exec('BEGIN IMMEDIATE');
     parentPort.postMessage('locked');
     Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, workerData.ms);
     db.exec('COMMIT');
     db.close();`,
    { eval: true, workerData: { file, ms, module: require.resolve('better-sqlite3') } },
  );
  await new Promise<void>((resolve) => worker.once('message', () => resolve()));
  return worker;
}

beforeAll(async () => {
  knex = createKnex(file);
  await migrateLatest(knex);
  await knex('users').insert({ id: 'u-ada', email: 'ada@example.test', display_name: 'Ada', password_hash: 'x', created_at: 1 });
  await knex('rooms').insert({ id: 'r-1', name: 'Log room', created_by: 'u-ada', created_at: 1, updated_at: 1 });
  rows = openSyncUpdateWriter(knex)!;
});
afterAll(async () => {
  rows.close();
  await knex.destroy();
  rmSync(dir, { recursive: true, force: true });
});

describe('RoomLogWriter with synchronous rows', () => {
  it('writes at once when the database is free, and in order behind a held write lock', async () => {
    const sent: RoomLogEntry[] = [];
    const log = new RoomLogWriter(knex, pino({ level: 'silent' }), DEFAULT_LIMITS, (_roomId, e) => sent.push(e), rows);

    // The first entry needs the person's name from the database: the async path.
    log.record('r-1', 'u-ada', [relabel('c1', 'C1', 'Cin')]);
    expect(sent).toHaveLength(0);
    await log.flush();
    expect(sent.map((e) => e.message)).toEqual(['Ada renamed C1 to Cin']);

    // Name known, database free: inserted and sent before record() returns.
    log.record('r-1', 'u-ada', [relabel('c2', 'C2', 'Cout')]);
    expect(sent.map((e) => e.message)).toEqual(['Ada renamed C1 to Cin', 'Ada renamed C2 to Cout']);

    // Database busy: the entry waits for the lock (Knex's busy timeout), and the one after it queues
    // behind it rather than taking the free synchronous path first.
    const worker = await holdWriteLock(300);
    log.record('r-1', 'u-ada', [relabel('l1', 'L1', 'Lfeed')]);
    log.record('r-1', 'u-ada', [relabel('l2', 'L2', 'Lstub')]);
    expect(sent).toHaveLength(2);
    await log.flush();
    await worker.terminate();
    expect(sent.map((e) => e.message)).toEqual(['Ada renamed C1 to Cin', 'Ada renamed C2 to Cout', 'Ada renamed L1 to Lfeed', 'Ada renamed L2 to Lstub']);
    const ids = sent.map((e) => e.id);
    expect([...ids].sort((a, b) => a - b)).toEqual(ids);
    const stored = await knex('room_log').where({ room_id: 'r-1' }).orderBy('id').select('id', 'message');
    expect(stored.map((r) => [Number(r.id), r.message])).toEqual(sent.map((e) => [e.id, e.message]));
    expect((await log.history('r-1')).map((e) => e.message)).toEqual(sent.map((e) => e.message));
  });

  it('rewrites a merged entry once the edits stop', async () => {
    const sent: RoomLogEntry[] = [];
    const log = new RoomLogWriter(knex, pino({ level: 'silent' }), { ...DEFAULT_LIMITS, logCoalesceMs: 50 }, (_roomId, e) => sent.push(e), rows);
    await log.displayName('u-ada'); // cached
    log.record('r-1', 'u-ada', [relabel('c9', 'C9', 'Ca')]);
    log.record('r-1', 'u-ada', [relabel('c9', 'Ca', 'Cb')]);
    const id = sent[0].id;
    expect((await knex('room_log').where({ id }).first('message')).message).toBe('Ada renamed C9 to Ca');
    await log.flush();
    expect(sent.at(-1)).toMatchObject({ id, message: 'Ada renamed C9 to Cb' });
    expect((await knex('room_log').where({ id }).first('message')).message).toBe('Ada renamed C9 to Cb');
  });
});
