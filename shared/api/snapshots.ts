/** Snapshots: the list entry, PATCH and restore bodies, the branch body. */
import { z } from 'zod';
import { jsonBody, personSchema } from './common';

export const snapshotLabelSchema = z
  .string({ error: 'must be a string' })
  .trim()
  .min(1, 'must not be empty')
  .max(200, 'must be at most 200 characters');

export const snapshotFiguresSchema = z.object({
  partCount: z.number(),
  worstInBand: z.object({ vswr: z.number().nullable(), returnLossDb: z.number().nullable() }).nullable(),
  bandwidth: z.object({ lowHz: z.number(), highHz: z.number(), fractional: z.number() }).nullable(),
  goalMet: z.boolean().nullable(),
  analysed: z.boolean(),
});
export type SnapshotFigures = z.infer<typeof snapshotFiguresSchema>;

export const snapshotSchema = z.object({
  id: z.string(),
  roomId: z.string(),
  label: z.string(),
  createdAt: z.number(),
  createdBy: personSchema.nullable(),
  figures: snapshotFiguresSchema.nullable(),
  forReview: z.boolean(),
});
export type Snapshot = z.infer<typeof snapshotSchema>;

/** `PATCH /api/snapshots/:id`: at least one field. */
export const snapshotPatchBodySchema = jsonBody({
  label: snapshotLabelSchema.optional(),
  forReview: z.boolean({ error: 'must be true or false' }).optional(),
}).refine((b) => b.label !== undefined || b.forReview !== undefined, {
  message: 'give "label" or "forReview" (or both)',
});
export type SnapshotPatchBody = z.infer<typeof snapshotPatchBodySchema>;

/** `POST /api/snapshots/:id/branch`. */
export const branchBodySchema = jsonBody({
  name: z
    .string({ error: 'must be a string' })
    .trim()
    .min(1, 'must not be empty')
    .max(200, 'must be at most 200 characters'),
  /** Give the new room the snapshot room's members, with their roles (the caller owns it either way). */
  copyMembers: z.boolean({ error: 'must be true or false' }).optional(),
});
export type BranchBody = z.infer<typeof branchBodySchema>;

/** `POST /api/rooms/:id/snapshots/:snapshotId/restore` -> 200. */
export const restoreResultSchema = z.object({
  roomId: z.string(),
  snapshotId: z.string(),
  /** false when the room already held the snapshot's design (nothing was written). */
  changed: z.boolean(),
  /** The room's state just before the restore, kept as a snapshot, so restoring that undoes this one. */
  undoSnapshot: snapshotSchema.nullable(),
  /** The room's design after the restore. */
  design: z.unknown(),
});
export type RestoreResult = z.infer<typeof restoreResultSchema>;
