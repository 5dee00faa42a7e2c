/**
 * `npm run backup` (server/cli/backup.ts) while a server runs and is written to: the copy opens in a new
 * server with every account, room and room design that existed before the backup began, each design
 * readable; and the restore path (stop, copy the backup over DATABASE_FILE, start) brings that state back.
 */
import { execFile } from 'node:child_process';
import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig, type Config } from '../../server/config';
import { startServer, type RunningServer } from '../../server/main';
import { insertElement, setElementField } from '../../shared/collab/schema';
import { chipAntennaDesign } from '../../shared/demo/designs';
import { parseDesign } from '../../shared/rf/design';
import { roomPeer, waitFor, type RoomPeer } from '../server/helpers/live';
import { signUp, TEST_PASSWORD } from '../server/helpers/test-server';

const run = promisify(execFile);
let dir = '';
let databaseFile = '';
let server: RunningServer;
const live = { agent: () => supertest.agent(server.url) };
const others: RunningServer[] = [];

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'matchloom-backup-'));
  databaseFile = join(dir, 'matchloom.sqlite3');
  server = await startServer(configFor(databaseFile), { clientDir: null });
});
afterAll(async () => {
  for (const s of others) await s.close().catch(() => {});
  await server.close().catch(() => {});
  rmSync(dir, { recursive: true, force: true });
});

function configFor(databaseFile: string): Config {
  return {
    ...loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_FILE: databaseFile, BCRYPT_COST: '4' }),
    port: 0,
    host: '127.0.0.1',
    seedDemo: false,
  };
}

async function backup(databaseFile: string, target: string): Promise<string> {
  const { stdout } = await run(join('node_modules', '.bin', 'tsx'), ['server/cli/backup.ts', target], {
    env: { ...process.env, DATABASE_FILE: databaseFile, NODE_ENV: 'test' },
  });
  return stdout;
}

async function signIn(url: string, email: string) {
  const agent = supertest.agent(url);
  await agent.post('/api/auth/signin').send({ email, password: TEST_PASSWORD }).expect(200);
  return agent;
}

describe('npm run backup on a live, busy server', () => {
  let ownerEmail = '';
  let backupFile = '';
  const roomsBefore: string[] = [];
  let editedRoom = '';
  let roomsInBackup: string[] = [];

  it('copies a consistent database while rooms are created and edited', async () => {
    const owner = await signUp(live, { displayName: 'Backup Owner' });
    ownerEmail = owner.user.email;
    const member = await signUp(live, { displayName: 'Backup Tuner' });
    for (let i = 0; i < 3; i++) {
      const id = (await owner.agent.post('/api/rooms').send({ name: `Kept ${i}`, design: chipAntennaDesign() }).expect(201)).body.id;
      roomsBefore.push(id);
    }
    editedRoom = roomsBefore[0]!;
    await owner.agent.post(`/api/rooms/${editedRoom}/members`).send({ email: member.user.email, role: 'tuner' }).expect(201);
    const peer: RoomPeer = roomPeer(server.url, owner.cookie, editedRoom);
    await peer.synced;
    insertElement(peer.doc, { id: 'l1', kind: 'series-l', value: 2.2e-9 });
    await waitFor(async () => {
      const d = (await owner.agent.get(`/api/rooms/${editedRoom}/design`).expect(200)).body;
      return d.elements.some((e: { id: string }) => e.id === 'l1');
    }, 'the edit in the room design');

    // Writers keep going while the backup runs: new rooms over the API, edits over the room socket.
    let writing = true;
    let created = 0;
    let edits = 0;
    const writer = (async () => {
      while (writing) {
        await owner.agent.post('/api/rooms').send({ name: `During ${created}`, design: chipAntennaDesign() }).expect(201);
        created += 1;
        setElementField(peer.doc, 'l1', 'value', (2.2 + edits * 0.1) * 1e-9);
        edits += 1;
      }
    })();
    await new Promise((r) => setTimeout(r, 200));
    backupFile = join(dir, 'copy.sqlite3');
    const out = await backup(databaseFile, backupFile);
    writing = false;
    await writer;
    peer.destroy();
    expect(out).toMatch(/backed up \d+ pages/);
    expect(created).toBeGreaterThan(0);

    const copy = await startServer(configFor(backupFile), { clientDir: null });
    others.push(copy);
    const agent = await signIn(copy.url, ownerEmail);
    const rooms = (await agent.get('/api/rooms').expect(200)).body as { id: string; name: string; role: string }[];
    const ids = rooms.map((r) => r.id);
    roomsInBackup = ids.slice().sort();
    expect(ids).toEqual(expect.arrayContaining(roomsBefore));
    expect(rooms.every((r) => r.role === 'owner')).toBe(true);
    for (const r of rooms) {
      const design = (await agent.get(`/api/rooms/${r.id}/design`).expect(200)).body;
      expect(() => parseDesign(design)).not.toThrow();
    }
    const edited = (await agent.get(`/api/rooms/${editedRoom}/design`).expect(200)).body;
    expect(edited.elements.map((e: { id: string }) => e.id)).toEqual(['l1']);
    const members = await copy.knex('room_members').where({ room_id: editedRoom });
    expect(members.map((m: { user_id: string }) => m.user_id).sort()).toEqual([owner.user.id, member.user.id].sort());
    await signIn(copy.url, member.user.email);
    await copy.close();
    others.pop();
  });

  it('restores: stop, copy the backup over the database file, start', async () => {
    expect(roomsInBackup.length).toBeGreaterThanOrEqual(3);
    const owner = await signIn(server.url, ownerEmail);
    const lateId = (await owner.post('/api/rooms').send({ name: 'After the backup' }).expect(201)).body.id;
    await server.close();
    // The documented restore (server/cli/backup.ts): with the server stopped, drop the old WAL files and
    // copy the backup over DATABASE_FILE.
    rmSync(`${databaseFile}-wal`, { force: true });
    rmSync(`${databaseFile}-shm`, { force: true });
    copyFileSync(backupFile, databaseFile);
    server = await startServer(configFor(databaseFile), { clientDir: null });
    const agent = await signIn(server.url, ownerEmail);
    const rooms = (await agent.get('/api/rooms').expect(200)).body as { id: string }[];
    expect(rooms.map((r) => r.id).sort()).toEqual(roomsInBackup);
    expect(rooms.map((r) => r.id)).not.toContain(lateId);
    const edited = (await agent.get(`/api/rooms/${editedRoom}/design`).expect(200)).body;
    expect(edited.elements.map((e: { id: string }) => e.id)).toEqual(['l1']);
    // The restored server takes writes again.
    await agent.post('/api/rooms').send({ name: 'After the restore' }).expect(201);
  });
});
