/**
 * Room events of the team features (notes, snapshots, uploads, branches), sent by the API server
 * through the collab hub's `emit(roomId, event, payload)` to every events socket joined to the room.
 * Server -> client only; the payloads are the API's own shapes (shared/api).
 *
 *   note-created      { roomId, note }
 *   note-updated      { roomId, note }
 *   note-deleted      { roomId, noteId, deletedIds }   (a thread's first note takes its replies with it)
 *   snapshot-updated  { roomId, snapshot }             (label or "for review" changed)
 *   snapshot-restored { roomId, snapshotId, undoSnapshotId, by }
 *   upload-created    { roomId, upload }
 *   branch-created    { roomId, snapshotId, branchRoomId }  (sent to the room the snapshot belongs to)
 *
 * `snapshot-created` (ROOM_EVENTS.snapshotCreated in events.ts) is also sent for the snapshot a restore
 * keeps of the state before it.
 */
import { z } from 'zod';
import { noteSchema } from '../api/notes';
import { snapshotSchema } from '../api/snapshots';
import { uploadSchema } from '../api/uploads';
import { personSchema } from '../api/common';

export const TEAM_EVENTS = {
  noteCreated: 'note-created',
  noteUpdated: 'note-updated',
  noteDeleted: 'note-deleted',
  snapshotUpdated: 'snapshot-updated',
  snapshotRestored: 'snapshot-restored',
  uploadCreated: 'upload-created',
  branchCreated: 'branch-created',
} as const;
export type TeamEventName = (typeof TEAM_EVENTS)[keyof typeof TEAM_EVENTS];

export const noteEventPayloadSchema = z.object({ roomId: z.string(), note: noteSchema });
export type NoteEventPayload = z.infer<typeof noteEventPayloadSchema>;

export const noteDeletedPayloadSchema = z.object({
  roomId: z.string(),
  noteId: z.string(),
  deletedIds: z.array(z.string()),
});
export type NoteDeletedPayload = z.infer<typeof noteDeletedPayloadSchema>;

export const snapshotUpdatedPayloadSchema = z.object({ roomId: z.string(), snapshot: snapshotSchema });
export type SnapshotUpdatedPayload = z.infer<typeof snapshotUpdatedPayloadSchema>;

export const snapshotRestoredPayloadSchema = z.object({
  roomId: z.string(),
  snapshotId: z.string(),
  undoSnapshotId: z.string().nullable(),
  by: personSchema,
});
export type SnapshotRestoredPayload = z.infer<typeof snapshotRestoredPayloadSchema>;

export const uploadCreatedPayloadSchema = z.object({ roomId: z.string(), upload: uploadSchema });
export type UploadCreatedPayload = z.infer<typeof uploadCreatedPayloadSchema>;

export const branchCreatedPayloadSchema = z.object({
  roomId: z.string(),
  snapshotId: z.string(),
  branchRoomId: z.string(),
});
export type BranchCreatedPayload = z.infer<typeof branchCreatedPayloadSchema>;
