/**
 * Review notes (the `notes` table): a remark pinned to an element, a chart frequency, both, or the
 * whole room. Replies form one level of thread under a first note. Anyone in the room may write one;
 * the author may edit its body; the author or an owner/tuner may resolve a thread; the author or an
 * owner may delete a note (a first note takes its replies with it).
 */
import type { Knex } from 'knex';
import type { Role } from '../auth/tokens';
import { badRequest, forbidden, notFound } from '../errors';
import { newId } from '../ids';
import { canEdit } from '../rooms/membership';
import type { Note } from '../../shared/api/notes';

interface NoteRow {
  id: string;
  room_id: string;
  parent_id: string | null;
  author_id: string | null;
  author_name: string | null;
  body: string;
  element_id: string | null;
  frequency_hz: number | null;
  resolved: number | boolean;
  resolved_by: string | null;
  resolver_name: string | null;
  resolved_at: number | null;
  created_at: number;
  updated_at: number | null;
}

const person = (id: string | null, name: string | null) => (id && name ? { id, displayName: name } : null);
const num = (v: number | null) => (v === null || v === undefined ? null : Number(v));

function toNote(r: NoteRow): Note {
  const resolved = Boolean(r.resolved);
  return {
    id: r.id,
    roomId: r.room_id,
    parentId: r.parent_id,
    author: person(r.author_id, r.author_name),
    body: r.body,
    elementId: r.element_id,
    frequencyHz: num(r.frequency_hz),
    resolved,
    resolvedBy: resolved ? person(r.resolved_by, r.resolver_name) : null,
    resolvedAt: resolved ? num(r.resolved_at) : null,
    createdAt: Number(r.created_at),
    editedAt: num(r.updated_at),
  };
}

function noteQuery(knex: Knex | Knex.Transaction) {
  return knex('notes as n')
    .leftJoin('users as a', 'a.id', 'n.author_id')
    .leftJoin('users as rb', 'rb.id', 'n.resolved_by')
    .select(
      'n.id',
      'n.room_id',
      'n.parent_id',
      'n.author_id',
      'a.display_name as author_name',
      'n.body',
      'n.element_id',
      'n.frequency_hz',
      'n.resolved',
      'n.resolved_by',
      'rb.display_name as resolver_name',
      'n.resolved_at',
      'n.created_at',
      'n.updated_at',
    );
}

export const noteNotFound = () => notFound('Note not found.');

/** A room's notes, oldest first (threads are read through `parentId`). */
export async function listNotes(knex: Knex | Knex.Transaction, roomId: string): Promise<Note[]> {
  const rows = (await noteQuery(knex)
    .where('n.room_id', roomId)
    .orderBy([
      { column: 'n.created_at', order: 'asc' },
      { column: 'n.rowid' as string, order: 'asc' },
    ])) as NoteRow[];
  return rows.map(toNote);
}

export async function getNote(
  knex: Knex | Knex.Transaction,
  roomId: string,
  noteId: string,
): Promise<Note | null> {
  const row = (await noteQuery(knex).where({ 'n.id': noteId, 'n.room_id': roomId }).first()) as
    NoteRow | undefined;
  return row ? toNote(row) : null;
}

export interface NewNote {
  roomId: string;
  authorId: string;
  body: string;
  elementId?: string;
  frequencyHz?: number;
  parentId?: string;
  now?: number;
}

/** Add a note or a reply. A reply to a reply joins the same thread (its first note is the parent). */
export async function createNote(knex: Knex, input: NewNote): Promise<Note> {
  return knex.transaction(async (trx) => {
    let parentId: string | null = null;
    if (input.parentId !== undefined) {
      if (input.elementId !== undefined || input.frequencyHz !== undefined)
        throw badRequest(
          'elementId: a reply is pinned where its thread is; leave out elementId and frequencyHz',
          {
            field: input.elementId !== undefined ? 'elementId' : 'frequencyHz',
          },
        );
      const parent = await trx('notes')
        .where({ id: input.parentId, room_id: input.roomId })
        .first('id', 'parent_id');
      if (!parent) throw badRequest('parentId: there is no such note in this room', { field: 'parentId' });
      parentId = parent.parent_id ?? parent.id;
    }
    const id = newId();
    await trx('notes').insert({
      id,
      room_id: input.roomId,
      author_id: input.authorId,
      parent_id: parentId,
      element_id: input.elementId ?? null,
      frequency_hz: input.frequencyHz ?? null,
      body: input.body,
      resolved: false,
      created_at: input.now ?? Date.now(),
    });
    return (await getNote(trx, input.roomId, id))!;
  });
}

/** Edit a note's body (author only) and/or resolve or reopen a thread (author, owner or tuner). */
export async function updateNote(
  knex: Knex,
  input: { roomId: string; noteId: string; userId: string; role: Role; body?: string; resolved?: boolean },
): Promise<Note> {
  return knex.transaction(async (trx) => {
    const note = await getNote(trx, input.roomId, input.noteId);
    if (!note) throw noteNotFound();
    const isAuthor = note.author?.id === input.userId;
    if (input.body !== undefined && !isAuthor) throw forbidden('Only the author can edit a note.');
    if (input.resolved !== undefined) {
      if (!isAuthor && !canEdit(input.role))
        throw forbidden('Only the author, an owner or a tuner can resolve a note.');
      if (note.parentId !== null)
        throw badRequest('resolved: a reply is resolved with its thread; resolve the thread’s first note', {
          field: 'resolved',
        });
    }
    const now = Date.now();
    const change: Record<string, unknown> = {};
    if (input.body !== undefined && input.body !== note.body)
      Object.assign(change, { body: input.body, updated_at: now });
    if (input.resolved !== undefined && input.resolved !== note.resolved)
      Object.assign(
        change,
        input.resolved
          ? { resolved: true, resolved_by: input.userId, resolved_at: now }
          : { resolved: false, resolved_by: null, resolved_at: null },
      );
    if (Object.keys(change).length > 0) await trx('notes').where({ id: note.id }).update(change);
    return (await getNote(trx, input.roomId, note.id))!;
  });
}

/** Delete a note (author or owner); a thread's first note takes its replies. Returns the deleted ids. */
export async function deleteNote(
  knex: Knex,
  input: { roomId: string; noteId: string; userId: string; role: Role },
): Promise<string[]> {
  return knex.transaction(async (trx) => {
    const note = await trx('notes')
      .where({ id: input.noteId, room_id: input.roomId })
      .first('id', 'author_id');
    if (!note) throw noteNotFound();
    if (note.author_id !== input.userId && input.role !== 'owner')
      throw forbidden('Only the author or an owner can delete a note.');
    const replies = (await trx('notes')
      .where({ room_id: input.roomId, parent_id: note.id })
      .pluck('id')) as string[];
    const ids = [note.id as string, ...replies];
    await trx('notes').whereIn('id', ids).delete();
    return ids;
  });
}
