/** Review notes of a room: list, write (or reply), edit or resolve, delete. Every change is sent live. */
import { Router } from 'express';
import { signedInUser } from '../auth/session';
import { badRequest } from '../errors';
import { requireRoomRole } from '../rooms/access';
import { loadRoomDesign } from '../collab/store';
import { createNote, deleteNote, listNotes, noteNotFound, updateNote } from '../services/notes';
import { check, idParam } from '../validate';
import { TEAM_EVENTS } from '../../shared/collab/team-events';
import { noteCreateBodySchema, notePatchBodySchema } from '../../shared/api/notes';
import { DesignError } from '../../shared/rf/design';
import type { AppDeps } from '../app';

function noteId(v: unknown): string {
  const r = idParam.safeParse(v);
  if (!r.success) throw noteNotFound();
  return r.data;
}

export function noteRoutes({ knex, events }: AppDeps): Router {
  const r = Router();

  /** A note pinned to an element must name one in the chain now (it may be removed later). */
  async function checkElement(roomId: string, elementId: string | undefined): Promise<void> {
    if (elementId === undefined) return;
    let ids: string[];
    try {
      ids = (await loadRoomDesign(knex, roomId)).elements.map((e) => e.id);
    } catch (e) {
      if (e instanceof DesignError) return; // a broken document cannot say; keep the note
      throw e;
    }
    if (!ids.includes(elementId))
      throw badRequest(`elementId: there is no element “${elementId}” in this room’s chain`, {
        field: 'elementId',
      });
  }

  r.get('/rooms/:id/notes', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    res.json(await listNotes(knex, roomId));
  });

  r.post('/rooms/:id/notes', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id);
    const body = check(noteCreateBodySchema, req.body);
    await checkElement(roomId, body.elementId);
    const note = await createNote(knex, { roomId, authorId: user.id, ...body });
    events.emit(roomId, TEAM_EVENTS.noteCreated, { roomId, note });
    res.status(201).json(note);
  });

  r.patch('/rooms/:id/notes/:noteId', async (req, res) => {
    const user = signedInUser(req);
    const { roomId, role } = await requireRoomRole(knex, req.params.id, user.id);
    const id = noteId(req.params.noteId);
    const body = check(notePatchBodySchema, req.body);
    const note = await updateNote(knex, { roomId, noteId: id, userId: user.id, role, ...body });
    events.emit(roomId, TEAM_EVENTS.noteUpdated, { roomId, note });
    res.json(note);
  });

  r.delete('/rooms/:id/notes/:noteId', async (req, res) => {
    const user = signedInUser(req);
    const { roomId, role } = await requireRoomRole(knex, req.params.id, user.id);
    const id = noteId(req.params.noteId);
    const deletedIds = await deleteNote(knex, { roomId, noteId: id, userId: user.id, role });
    events.emit(roomId, TEAM_EVENTS.noteDeleted, { roomId, noteId: id, deletedIds });
    res.status(204).end();
  });

  return r;
}
