/** Snapshots of a room: take, list, read, rename or mark for review, restore, and branch from one. */
import { Router, type Request } from 'express';
import { z } from 'zod';
import { signedInUser } from '../auth/session';
import { requireRoomRole } from '../rooms/access';
import { EDITOR_ROLES } from '../rooms/membership';
import { requireSnapshotRole, snapshotNotFound } from '../rooms/snapshot-access';
import {
  branchFromSnapshot,
  createSnapshot,
  getSnapshot,
  listSnapshots,
  updateSnapshot,
  type SnapshotView,
} from '../services/snapshots';
import { getRoomDetails, listMembers } from '../services/rooms';
import { restoreSnapshot } from '../services/room-edits';
import { sendReviewRequests } from '../services/reviews';
import { appBaseUrl } from '../links';
import { bodyObject, check } from '../validate';
import { ROOM_EVENTS } from '../../shared/collab/events';
import { TEAM_EVENTS } from '../../shared/collab/team-events';
import { branchBodySchema, snapshotLabelSchema, snapshotPatchBodySchema } from '../../shared/api/snapshots';
import type { AppDeps } from '../app';

const snapshotBody = bodyObject({
  label: snapshotLabelSchema,
  forReview: z.boolean({ error: 'must be true or false' }).optional(),
});

export function snapshotRoutes(deps: AppDeps): Router {
  const { knex, events, config } = deps;
  const r = Router();

  /** Mail the room's reviewers; a mail failure is logged, never the caller's error. */
  async function askForReview(
    req: Request,
    snapshot: SnapshotView,
    requester: { id: string; displayName: string },
  ) {
    await sendReviewRequests(deps, { snapshot, requester, baseUrl: appBaseUrl(req, config) });
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
    if (snapshot.forReview) await askForReview(req, snapshot, user);
    res.status(201).json(snapshot);
  });

  r.get('/rooms/:id/snapshots', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    res.json(await listSnapshots(knex, roomId));
  });

  r.get('/snapshots/:id', async (req, res) => {
    const { snapshotId } = await requireSnapshotRole(knex, req.params.id, signedInUser(req).id);
    const snapshot = await getSnapshot(knex, snapshotId);
    if (!snapshot) throw snapshotNotFound();
    res.json(snapshot);
  });

  r.patch('/snapshots/:id', async (req, res) => {
    const user = signedInUser(req);
    const { snapshotId, roomId } = await requireSnapshotRole(knex, req.params.id, user.id, EDITOR_ROLES);
    const body = check(snapshotPatchBodySchema, req.body);
    const { snapshot, markedForReview } = await updateSnapshot(knex, snapshotId, body);
    events.emit(roomId, TEAM_EVENTS.snapshotUpdated, { roomId, snapshot });
    if (markedForReview) await askForReview(req, snapshot, user);
    res.json(snapshot);
  });

  r.post('/rooms/:id/snapshots/:snapshotId/restore', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, EDITOR_ROLES);
    // Any snapshot the caller may read: this room's, or one of another room they belong to (a parent's).
    const { snapshotId } = await requireSnapshotRole(knex, req.params.snapshotId, user.id);
    const snapshot = await getSnapshot(knex, snapshotId);
    if (!snapshot) throw snapshotNotFound();
    const outcome = await restoreSnapshot(
      { knex, sink: deps.roomUpdates },
      { roomId, snapshot, userId: user.id },
    );
    if (outcome.undoSnapshot)
      events.emit(roomId, ROOM_EVENTS.snapshotCreated, { roomId, snapshot: outcome.undoSnapshot });
    if (outcome.changed)
      events.emit(roomId, TEAM_EVENTS.snapshotRestored, {
        roomId,
        snapshotId,
        undoSnapshotId: outcome.undoSnapshot?.id ?? null,
        by: { id: user.id, displayName: user.displayName },
      });
    res.json({ roomId, snapshotId, ...outcome });
  });

  r.post('/snapshots/:id/branch', async (req, res) => {
    const user = signedInUser(req);
    const { snapshotId, roomId: sourceRoomId } = await requireSnapshotRole(
      knex,
      req.params.id,
      user.id,
      EDITOR_ROLES,
    );
    const body = check(branchBodySchema, req.body);
    const members = body.copyMembers
      ? (await listMembers(knex, sourceRoomId)).map((m) => ({ userId: m.userId, role: m.role }))
      : undefined;
    const roomId = await branchFromSnapshot(knex, { snapshotId, name: body.name, userId: user.id, members });
    events.emit(sourceRoomId, TEAM_EVENTS.branchCreated, {
      roomId: sourceRoomId,
      snapshotId,
      branchRoomId: roomId,
    });
    res.status(201).json({ roomId, room: await getRoomDetails(knex, roomId, user.id) });
  });

  return r;
}
