/** Snapshots of a room, and branches started from them. */
import { Router } from 'express';
import { z } from 'zod';
import { signedInUser } from '../auth/session';
import { notFound } from '../errors';
import { requireRoomRole } from '../rooms/access';
import { EDITOR_ROLES } from '../rooms/membership';
import {
  branchFromSnapshot,
  createSnapshot,
  getSnapshot,
  listSnapshots,
  snapshotRoomId,
} from '../services/snapshots';
import { getRoomDetails } from '../services/rooms';
import { bodyObject, check, idParam, roomNameSchema } from '../validate';
import { ROOM_EVENTS } from '../../shared/collab/events';
import type { AppDeps } from '../app';

const snapshotBody = bodyObject({
  label: z
    .string({ error: 'must be a string' })
    .trim()
    .min(1, 'must not be empty')
    .max(200, 'must be at most 200 characters'),
  forReview: z.boolean({ error: 'must be true or false' }).optional(),
});
const branchBody = bodyObject({ name: roomNameSchema });

const snapshotNotFound = () => notFound('Snapshot not found.');

export function snapshotRoutes({ knex, events }: AppDeps): Router {
  const r = Router();

  /** The snapshot's room and the caller's role there; a non-member gets 404 for the snapshot too. */
  async function snapshotAccess(snapshotId: unknown, userId: string, allowed?: typeof EDITOR_ROLES) {
    const id = idParam.safeParse(snapshotId);
    const roomId = id.success ? await snapshotRoomId(knex, id.data) : null;
    if (!id.success || !roomId) throw snapshotNotFound();
    try {
      return { snapshotId: id.data, ...(await requireRoomRole(knex, roomId, userId, allowed)) };
    } catch (e) {
      if ((e as { status?: number }).status === 404) throw snapshotNotFound();
      throw e;
    }
  }

  r.post('/rooms/:id/snapshots', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, EDITOR_ROLES);
    const body = check(snapshotBody, req.body);
    const snapshot = await createSnapshot(knex, {
      roomId,
      label: body.label,
      userId: user.id,
      forReview: body.forReview,
    });
    events.emit(roomId, ROOM_EVENTS.snapshotCreated, { roomId, snapshot });
    res.status(201).json(snapshot);
  });

  r.get('/rooms/:id/snapshots', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    res.json(await listSnapshots(knex, roomId));
  });

  r.get('/snapshots/:id', async (req, res) => {
    const { snapshotId } = await snapshotAccess(req.params.id, signedInUser(req).id);
    const snapshot = await getSnapshot(knex, snapshotId);
    if (!snapshot) throw snapshotNotFound();
    res.json(snapshot);
  });

  r.post('/snapshots/:id/branch', async (req, res) => {
    const user = signedInUser(req);
    const { snapshotId } = await snapshotAccess(req.params.id, user.id, EDITOR_ROLES);
    const body = check(branchBody, req.body);
    const roomId = await branchFromSnapshot(knex, { snapshotId, name: body.name, userId: user.id });
    res.status(201).json({ roomId, room: await getRoomDetails(knex, roomId, user.id) });
  });

  return r;
}
