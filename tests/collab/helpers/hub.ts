/**
 * The collab hub alone on a bare http server, with shortened limits (compaction, unload delay), over a
 * real migrated SQLite file. People and rooms are written straight into the database; sessions are real
 * tokens from the real token service.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { pino } from 'pino';
import type { Knex } from 'knex';
import { createKnex, migrateLatest } from '../../../server/db';
import { createTokenService, type Role, type TokenService } from '../../../server/auth/tokens';
import { createCollabHub, type CollabHub } from '../../../server/collab/index';
import type { CollabLimits } from '../../../server/collab/limits';
import { createRoomDocument } from '../../../server/collab/store';
import type { DesignInput } from '../../../shared/rf/design';
import { Api, designWith, tempDir, testConfig, type Person } from './world';

export interface HubWorld {
  api: Api;
  hub: CollabHub;
  knex: Knex;
  tokens: TokenService;
  databaseFile: string;
  person(displayName: string): Promise<Person>;
  room(owner: Person, design?: DesignInput, members?: [Person, Role][]): Promise<string>;
  /** Close the hub and server but keep the database (for a restart on the same file). */
  stop(): Promise<void>;
  close(): Promise<void>;
}

let n = 0;

export async function startHub(limits: Partial<CollabLimits>, dir = tempDir()): Promise<HubWorld> {
  const databaseFile = join(dir, 'collab.sqlite3');
  const config = testConfig(databaseFile);
  const knex = createKnex(databaseFile);
  await migrateLatest(knex);
  const tokens = createTokenService(config.jwtSecret);
  const hub = createCollabHub({ knex, tokens, logger: pino({ level: 'silent' }), config }, limits);
  const server = http.createServer((_req, res) => res.writeHead(404).end());
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const api = new Api(`http://127.0.0.1:${(server.address() as AddressInfo).port}`);
  let stopped = false;
  const stop = async () => {
    if (stopped) return;
    stopped = true;
    await hub.close();
    server.closeAllConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
    await knex.destroy();
  };
  return {
    api,
    hub,
    knex,
    tokens,
    databaseFile,
    async person(displayName) {
      n += 1;
      const id = `u-${process.pid}-${n}-${Math.random().toString(36).slice(2, 8)}`;
      const email = `${id}@example.test`;
      const exists = await knex('users').where({ display_name: displayName }).first('id');
      const userId = exists ? String(exists.id) : id;
      if (!exists) await knex('users').insert({ id, email, display_name: displayName, password_hash: 'x', created_at: Date.now() });
      return { id: userId, email, displayName, cookie: `ml_session=${await tokens.signSession(userId)}` };
    },
    async room(owner, design = designWith(), members = []) {
      n += 1;
      const id = `room-${process.pid}-${n}`;
      const now = Date.now();
      await knex('rooms').insert({ id, name: 'Hub test room', created_by: owner.id, created_at: now, updated_at: now });
      await knex('room_members').insert([
        { room_id: id, user_id: owner.id, role: 'owner', created_at: now },
        ...members.map(([p, role]) => ({ room_id: id, user_id: p.id, role, created_at: now })),
      ]);
      await createRoomDocument(knex, id, design);
      return id;
    },
    stop,
    async close() {
      await stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
