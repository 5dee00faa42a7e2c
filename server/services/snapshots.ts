/**
 * Snapshots (a saved, named state of a room: its Yjs state and its design file, with headline figures)
 * and branches (a new room started from a snapshot, remembering it as its parent).
 */
import * as Y from 'yjs';
import type { Knex } from 'knex';
import { loadRoomDocument } from '../collab/store';
import { HttpError, notFound } from '../errors';
import { newId } from '../ids';
import { createRoomIn } from './rooms';
import { designFigures, type DesignFigures } from './figures';
import { readDesign, setDesignField } from '../../shared/collab/schema';
import { DesignError, parseDesign, type Design, type DesignInput } from '../../shared/rf/design';

export interface SnapshotView {
  id: string;
  roomId: string;
  label: string;
  createdAt: number;
  createdBy: { id: string; displayName: string } | null;
  figures: DesignFigures | null;
  forReview: boolean;
}

interface SnapshotRow {
  id: string;
  room_id: string;
  label: string;
  created_at: number;
  created_by: string | null;
  display_name: string | null;
  figures_json: string | null;
  for_review: number | boolean;
}

function parseFigures(text: string | null): DesignFigures | null {
  if (!text) return null;
  try {
    return JSON.parse(text) as DesignFigures;
  } catch {
    return null;
  }
}

function toView(r: SnapshotRow): SnapshotView {
  return {
    id: r.id,
    roomId: r.room_id,
    label: r.label,
    createdAt: Number(r.created_at),
    createdBy: r.created_by && r.display_name ? { id: r.created_by, displayName: r.display_name } : null,
    figures: parseFigures(r.figures_json),
    forReview: Boolean(r.for_review),
  };
}

function snapshotQuery(knex: Knex | Knex.Transaction) {
  return knex('snapshots as s')
    .leftJoin('users as u', 'u.id', 's.created_by')
    .select(
      's.id',
      's.room_id',
      's.label',
      's.created_at',
      's.created_by',
      'u.display_name',
      's.figures_json',
      's.for_review',
    );
}

export interface NewSnapshot {
  roomId: string;
  label: string;
  design: Design | DesignInput;
  state: Uint8Array;
  createdBy: string | null;
  forReview?: boolean;
  now?: number;
}

/** Store a snapshot row (the route and the demo seed both use this). */
export async function insertSnapshot(knex: Knex | Knex.Transaction, s: NewSnapshot): Promise<string> {
  const design = parseDesign(s.design);
  const figures = designFigures(design);
  const id = newId();
  await knex('snapshots').insert({
    id,
    room_id: s.roomId,
    label: s.label,
    design_json: JSON.stringify(design),
    state: Buffer.from(s.state),
    figures_json: JSON.stringify(figures),
    for_review: s.forReview ?? false,
    created_by: s.createdBy,
    created_at: s.now ?? Date.now(),
  });
  return id;
}

/**
 * Snapshot the room's current document. The document is read in one transaction (so a compaction
 * cannot slip between its state and its log); the engine runs outside it. A document that no longer
 * holds a valid design is a 409.
 */
export async function createSnapshot(
  knex: Knex,
  input: { roomId: string; label: string; userId: string; forReview?: boolean },
): Promise<SnapshotView> {
  const { design, state } = await knex.transaction(async (trx) => {
    const { doc } = await loadRoomDocument(trx, input.roomId);
    try {
      return { design: readDesign(doc), state: Y.encodeStateAsUpdate(doc) };
    } catch (e) {
      if (e instanceof DesignError)
        throw new HttpError(
          409,
          'invalid-design',
          `The room document does not hold a valid design: ${e.message}`,
          { path: e.path },
        );
      throw e;
    } finally {
      doc.destroy();
    }
  });
  let id: string;
  try {
    id = await insertSnapshot(knex, {
      roomId: input.roomId,
      label: input.label,
      design,
      state,
      createdBy: input.userId,
      forReview: input.forReview,
    });
  } catch (e) {
    // The room was deleted while the engine ran.
    if ((e as { code?: string }).code === 'SQLITE_CONSTRAINT_FOREIGNKEY') throw notFound('Room not found.');
    throw e;
  }
  return toView((await snapshotQuery(knex).where('s.id', id).first()) as SnapshotRow);
}

/** A room's snapshots, newest first. */
export async function listSnapshots(knex: Knex | Knex.Transaction, roomId: string): Promise<SnapshotView[]> {
  const rows = (await snapshotQuery(knex)
    .where('s.room_id', roomId)
    .orderBy([
      { column: 's.created_at', order: 'desc' },
      { column: 's.rowid' as string, order: 'desc' },
    ])) as SnapshotRow[];
  return rows.map(toView);
}

/** The room a snapshot belongs to (null when there is no such snapshot). */
export async function snapshotRoomId(
  knex: Knex | Knex.Transaction,
  snapshotId: string,
): Promise<string | null> {
  const row = await knex('snapshots').where({ id: snapshotId }).first('room_id');
  return row ? String(row.room_id) : null;
}

/** One snapshot with its design file. */
export async function getSnapshot(
  knex: Knex | Knex.Transaction,
  snapshotId: string,
): Promise<(SnapshotView & { design: Design }) | null> {
  const row = (await snapshotQuery(knex).select('s.design_json').where('s.id', snapshotId).first()) as
    (SnapshotRow & { design_json: string }) | undefined;
  if (!row) return null;
  return { ...toView(row), design: parseDesign(JSON.parse(row.design_json)) };
}

/**
 * Start a new room from a snapshot: its document continues the snapshot's Yjs state (with the design's
 * name set to the new room's), the caller owns it, and `parent_snapshot_id` records the lineage.
 */
export async function branchFromSnapshot(
  knex: Knex,
  input: {
    snapshotId: string;
    name: string;
    userId: string;
    members?: { userId: string; role: 'owner' | 'tuner' | 'observer' }[];
  },
): Promise<string> {
  return knex.transaction(async (trx) => {
    const row = await trx('snapshots').where({ id: input.snapshotId }).first('state', 'design_json');
    if (!row) throw notFound('Snapshot not found.');
    const doc = new Y.Doc();
    try {
      Y.applyUpdate(doc, new Uint8Array(row.state as Buffer));
      setDesignField(doc, 'name', input.name);
      const design = readDesign(doc);
      return await createRoomIn(trx, {
        name: input.name,
        ownerId: input.userId,
        design,
        state: Y.encodeStateAsUpdate(doc),
        parentSnapshotId: input.snapshotId,
        members: input.members,
      });
    } finally {
      doc.destroy();
    }
  });
}

/**
 * Rename a snapshot and/or mark it for review (or clear the mark). `markedForReview` is true when this
 * call turned the mark on (the caller then asks the room's reviewers).
 */
export async function updateSnapshot(
  knex: Knex,
  snapshotId: string,
  change: { label?: string; forReview?: boolean },
): Promise<{ snapshot: SnapshotView; markedForReview: boolean }> {
  return knex.transaction(async (trx) => {
    const row = await trx('snapshots').where({ id: snapshotId }).first('for_review');
    if (!row) throw notFound('Snapshot not found.');
    const update: Record<string, unknown> = {};
    if (change.label !== undefined) update.label = change.label;
    if (change.forReview !== undefined) update.for_review = change.forReview;
    if (Object.keys(update).length > 0) await trx('snapshots').where({ id: snapshotId }).update(update);
    const snapshot = toView((await snapshotQuery(trx).where('s.id', snapshotId).first()) as SnapshotRow);
    return { snapshot, markedForReview: change.forReview === true && !row.for_review };
  });
}
