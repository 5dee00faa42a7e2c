// A room document read while a compaction commits between its two reads (the compacted state, then the
// log rows) must still hold every update: the load reads again when the state changed under it. Real
// SQLite file; the compaction is made by the room writer's own connection, from Knex's query event, at
// the moment the log rows are about to be read.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { rmSync } from 'node:fs';
import * as Y from 'yjs';
import type { Knex } from 'knex';
import { createKnex, migrateLatest } from '../../server/db';
import { appendUpdates, createRoomDocument, loadRoomDesign, loadRoomDocument, openSyncUpdateWriter, type SyncUpdateWriter } from '../../server/collab/store';
import { setElementField } from '../../shared/collab/schema';
import { designWith, tempDir } from './helpers/world';

let dir: string;
let knex: Knex;
let writer: SyncUpdateWriter;

beforeAll(async () => {
  dir = tempDir('matchloom-load-race-');
  knex = createKnex(join(dir, 'race.sqlite3'));
  await migrateLatest(knex);
  writer = openSyncUpdateWriter(knex)!;
});
afterAll(async () => {
  writer.close();
  await knex.destroy();
  rmSync(dir, { recursive: true, force: true });
});

describe('loading a room document', () => {
  it('holds every update when a compaction commits between reading the state and reading the log', async () => {
    // Common practice (no source): a load must see one moment of the store, never half of a compaction.
    const now = Date.now();
    await knex('users').insert({ id: 'u1', email: 'u1@example.test', display_name: 'Tuner', password_hash: 'x', created_at: now });
    await knex('rooms').insert({ id: 'r1', name: 'Race', created_by: 'u1', created_at: now, updated_at: now });
    await createRoomDocument(knex, 'r1', designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }]));
    // Three edits in the log, the last setting 4 pF.
    const edit = (await loadRoomDocument(knex, 'r1')).doc;
    const updates: Uint8Array[] = [];
    edit.on('update', (u: Uint8Array) => updates.push(u));
    for (const v of [2e-12, 3e-12, 4e-12]) setElementField(edit, 'c1', 'value', v);
    await appendUpdates(knex, 'r1', updates.map((update) => ({ update, userId: 'u1' })));
    const full = await loadRoomDocument(knex, 'r1');
    const merged = Y.encodeStateAsUpdate(full.doc);
    full.doc.destroy();
    edit.destroy();

    let compacted = false;
    const compactBeforeTheLogRead = (q: { sql: string }) => {
      if (compacted || !/from [`"]room_updates[`"]/i.test(q.sql) || !/^select/i.test(q.sql)) return;
      compacted = true;
      expect(writer.saveState('r1', merged, full.lastUpdateId)).toBe(true);
    };
    knex.on('query', compactBeforeTheLogRead);
    try {
      const design = await loadRoomDesign(knex, 'r1');
      expect(compacted).toBe(true);
      expect(design.elements.find((e) => e.id === 'c1')).toMatchObject({ value: 4e-12 });
    } finally {
      knex.removeListener('query', compactBeforeTheLogRead);
    }
  });
});
