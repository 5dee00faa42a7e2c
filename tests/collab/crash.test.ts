// Crash safety: a server in a child process is killed with SIGKILL in the middle of a burst of edits from
// two clients. After a restart on the same SQLite file, every edit that a third, fresh client had
// received before the kill is in the room document.
import { spawn, type ChildProcess } from 'node:child_process';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import { afterAll, describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { insertElement, orderedElementIds, readDesignInput, setElementField } from '../../shared/collab/schema';
import { Api, designWith, prng, sleep, tempDir, until } from './helpers/world';

const SCRIPT = join(process.cwd(), 'tests', 'collab', 'fixtures', 'crash-server.ts');
const dir = tempDir('matchloom-crash-');
const databaseFile = join(dir, 'crash.sqlite3');
const children: ChildProcess[] = [];

afterAll(() => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  rmSync(dir, { recursive: true, force: true });
});

async function startChild(): Promise<{ child: ChildProcess; api: Api }> {
  // `node --import tsx`, not the tsx wrapper: the wrapper runs the script in a grandchild, which a
  // SIGKILL of the wrapper would leave running.
  const child = spawn(process.execPath, ['--import', 'tsx', SCRIPT], { env: { ...process.env, DATABASE_FILE: databaseFile, LOG_LEVEL: 'silent' }, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  let stderr = '';
  child.stderr!.on('data', (d) => (stderr += String(d)));
  const port = await new Promise<number>((resolve, reject) => {
    const lines = createInterface({ input: child.stdout! });
    lines.once('line', (line) => resolve(JSON.parse(line).port));
    child.once('exit', (code) => reject(new Error(`server exited (${code}): ${stderr}`)));
  });
  return { child, api: new Api(`http://127.0.0.1:${port}`) };
}

describe('a server killed during a burst of edits', () => {
  it('keeps every edit a fresh client had received before the kill', async () => {
    const first = await startChild();
    const owner = await first.api.signUp('Owner');
    const tuner = await first.api.signUp('Tuner');
    const watcherPerson = await first.api.signUp('Watcher');
    const roomId = await first.api.createRoom(owner, designWith([{ id: 'c0', kind: 'shunt-c', value: 1e-12 }]));
    await first.api.addMember(owner, roomId, tuner, 'tuner');
    await first.api.addMember(owner, roomId, watcherPerson, 'observer');

    const a = first.api.peer(owner, roomId);
    const b = first.api.peer(tuner, roomId);
    const watcher = first.api.peer(watcherPerson, roomId);
    await Promise.all([a.synced, b.synced, watcher.synced]);
    let received = 0;
    watcher.doc.on('update', (_u: Uint8Array, origin: unknown) => {
      if (origin === watcher.provider) received++;
    });
    const watcherClosed = new Promise<void>((resolve) => watcher.provider.on('connection-close', () => resolve()));

    // The burst: both editors change values and add elements as fast as the event loop lets them.
    const rnd = prng(7);
    let killedAt = -1;
    for (let i = 0; killedAt < 0 ? i < 3000 : i < killedAt + 50; i++) {
      const p = i % 2 === 0 ? a : b;
      if (rnd() < 0.2) insertElement(p.doc, { id: `e${i}`, kind: rnd() < 0.5 ? 'series-l' : 'shunt-c', value: (1 + i) * 1e-12 });
      else {
        const ids = orderedElementIds(p.doc);
        setElementField(p.doc, ids[Math.floor(rnd() * ids.length)], 'value', (1 + i) * 1e-12);
      }
      if (i % 4 === 0) await sleep(1);
      if (killedAt < 0 && received >= 120) {
        first.child.kill('SIGKILL');
        killedAt = i;
      }
    }
    expect(killedAt).toBeGreaterThan(0);
    await watcherClosed;
    // What the fresh client holds now is at most what the server sent before it died.
    const seenState = Y.encodeStateAsUpdate(watcher.doc);
    const seenDesign = readDesignInput(watcher.doc);
    for (const p of [a, b, watcher]) p.destroy();
    expect(seenDesign.elements!.length).toBeGreaterThan(1);

    const second = await startChild();
    const check = second.api.peer(owner, roomId);
    await check.synced;
    const restored = check.doc;
    const restoredVector = Y.decodeStateVector(Y.encodeStateVector(restored));
    for (const [client, clock] of Y.decodeStateVector(Y.encodeStateVectorFromUpdate(seenState)))
      expect(restoredVector.get(client) ?? 0).toBeGreaterThanOrEqual(clock);
    // Applying what the watcher saw to the restored document adds nothing.
    const before = JSON.stringify(readDesignInput(restored));
    const merged = new Y.Doc();
    Y.applyUpdate(merged, Y.encodeStateAsUpdate(restored));
    Y.applyUpdate(merged, seenState);
    expect(JSON.stringify(readDesignInput(merged))).toBe(before);
    // And the stored design (what GET /design serves) holds every element the watcher saw.
    const design = await second.api.design(owner, roomId);
    const storedIds = new Set(design.elements.map((e: { id: string }) => e.id));
    for (const e of seenDesign.elements!) expect(storedIds.has(e.id)).toBe(true);
    check.destroy();
    merged.destroy();
    second.child.kill('SIGTERM');
    await until('the second server to exit', () => second.child.exitCode !== null || second.child.signalCode !== null, 5000);
  }, 90_000); // two server start-ups under tsx: about 2 s each on an idle machine, far more on a busy one
});

