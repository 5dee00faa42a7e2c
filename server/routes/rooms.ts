/** Rooms: list, create, details, rename, delete, the current design, and the collab ticket. */
import { Router } from 'express';
import { z } from 'zod';
import { signedInUser } from '../auth/session';
import { COLLAB_TTL_SECONDS } from '../auth/tokens';
import { loadRoomDesign } from '../collab/store';
import { HttpError, designHttpError } from '../errors';
import { requireRoomRole, roomNotFound } from '../rooms/access';
import { createRoom, deleteRoom, getRoomDetails, listRooms, renameRoom } from '../services/rooms';
import { bodyObject, check, roomNameSchema } from '../validate';
import { DesignError, parseDesign, type Design } from '../../shared/rf/design';
import { defaultDesign } from '../../shared/demo/designs';
import type { AppDeps } from '../app';

const createBody = bodyObject({ name: roomNameSchema, design: z.unknown().optional() });
const renameBody = bodyObject({ name: roomNameSchema });

function designFromBody(design: unknown, name: string): Design {
  if (design === undefined || design === null) return parseDesign(defaultDesign(name));
  try {
    return parseDesign(design);
  } catch (e) {
    if (e instanceof DesignError) throw designHttpError(e, 'design');
    throw e;
  }
}

export function roomRoutes({ knex, tokens, events }: AppDeps): Router {
  const r = Router();

  r.get('/rooms', async (req, res) => {
    res.json(await listRooms(knex, signedInUser(req).id));
  });

  r.post('/rooms', async (req, res) => {
    const user = signedInUser(req);
    const body = check(createBody, req.body);
    const design = designFromBody(body.design, body.name);
    const id = await createRoom(knex, { name: body.name, ownerId: user.id, design });
    res.status(201).json(await getRoomDetails(knex, id, user.id));
  });

  r.get('/rooms/:id', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id);
    const details = await getRoomDetails(knex, roomId, user.id);
    if (!details) throw roomNotFound();
    res.json(details);
  });

  r.patch('/rooms/:id', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, ['owner']);
    const body = check(renameBody, req.body);
    await renameRoom(knex, roomId, body.name);
    res.json(await getRoomDetails(knex, roomId, user.id));
  });

  r.delete('/rooms/:id', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, ['owner']);
    await deleteRoom(knex, roomId);
    events.roomDeleted(roomId);
    res.status(204).end();
  });

  r.get('/rooms/:id/design', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id);
    try {
      res.json(await loadRoomDesign(knex, roomId));
    } catch (e) {
      if (e instanceof DesignError)
        throw new HttpError(
          409,
          'invalid-design',
          `The room document does not hold a valid design: ${e.message}`,
          { path: e.path },
        );
      throw e;
    }
  });

  r.post('/rooms/:id/collab-token', async (req, res) => {
    const user = signedInUser(req);
    const { roomId, role } = await requireRoomRole(knex, req.params.id, user.id);
    const token = await tokens.signCollab({ userId: user.id, roomId, role });
    res.json({ token, roomId, role, expiresInSeconds: COLLAB_TTL_SECONDS });
  });

  return r;
}
