/**
 * A second SQLite connection on another thread that holds the write lock of a database file for a while:
 * `holdWriteLock(file, ms)` resolves once the lock is taken; `released` resolves when it has committed.
 * It runs on a worker thread because better-sqlite3 waits for a lock synchronously: a holder on the
 * server's own thread could never let go while the server waits.
 */
import { Worker } from 'node:worker_threads';
import { createRequire } from 'node:module';

const WORKER_SOURCE = `
const { parentPort, workerData } = require('node:worker_threads');
const Database = require(workerData.module);
const db = new Database(workerData.file);
db.pragma('busy_timeout = 5000');
db.exec('BEGIN IMMEDIATE');
db.prepare("create table if not exists lock_probe (n integer)").run();
db.prepare("insert into lock_probe (n) values (1)").run();
parentPort.postMessage('locked');
Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, workerData.ms);
db.exec('COMMIT');
db.close();
parentPort.postMessage('released');
`;

export interface HeldLock {
  /** when the lock was taken (Date.now()). */
  lockedAt: number;
  /** resolves with the time (Date.now()) the holder committed. */
  released: Promise<number>;
}

export function holdWriteLock(file: string, ms: number): Promise<HeldLock> {
  const worker = new Worker(WORKER_SOURCE, {
    eval: true,
    workerData: { file, ms, module: createRequire(import.meta.url).resolve('better-sqlite3') },
  });
  return new Promise((resolveLocked, rejectLocked) => {
    let releasedResolve: (t: number) => void = () => {};
    const released = new Promise<number>((r) => (releasedResolve = r));
    worker.on('message', (m: string) => {
      if (m === 'locked') resolveLocked({ lockedAt: Date.now(), released });
      if (m === 'released') releasedResolve(Date.now());
    });
    worker.on('error', rejectLocked);
  });
}
