/**
 * Review notes: a remark pinned to an element, to a chart frequency, or to the whole room; replies
 * (`parentId`) form a thread under the first note. Bodies and the note as the API returns it.
 */
import { z } from 'zod';
import { apiIdSchema, jsonBody, personSchema } from './common';

export const NOTE_BODY_MAX = 4000;

export const noteTextSchema = z
  .string({ error: 'must be a string' })
  .trim()
  .min(1, 'must not be empty')
  .max(NOTE_BODY_MAX, `must be at most ${NOTE_BODY_MAX} characters`);

/** `POST /api/rooms/:id/notes`. A reply (`parentId`) sits in its thread and takes no pin of its own. */
export const noteCreateBodySchema = jsonBody({
  body: noteTextSchema,
  elementId: z
    .string({ error: 'must be a string' })
    .min(1, 'must not be empty')
    .max(100, 'must be at most 100 characters')
    .optional(),
  frequencyHz: z
    .number({ error: 'must be a number of hertz' })
    .refine(
      (v) => Number.isFinite(v) && v > 0 && v <= 1e13,
      'must be a positive frequency in hertz (at most 10 THz)',
    )
    .optional(),
  parentId: apiIdSchema.optional(),
});
export type NoteCreateBody = z.infer<typeof noteCreateBodySchema>;

/** `PATCH /api/rooms/:id/notes/:noteId`: at least one field. */
export const notePatchBodySchema = jsonBody({
  body: noteTextSchema.optional(),
  resolved: z.boolean({ error: 'must be true or false' }).optional(),
}).refine((b) => b.body !== undefined || b.resolved !== undefined, {
  message: 'give "body" or "resolved" (or both)',
});
export type NotePatchBody = z.infer<typeof notePatchBodySchema>;

export const noteSchema = z.object({
  id: z.string(),
  roomId: z.string(),
  /** The thread's first note, or null for a first note. */
  parentId: z.string().nullable(),
  author: personSchema.nullable(),
  body: z.string(),
  elementId: z.string().nullable(),
  frequencyHz: z.number().nullable(),
  /** Only a thread's first note is resolved (its replies go with it). */
  resolved: z.boolean(),
  resolvedBy: personSchema.nullable(),
  resolvedAt: z.number().nullable(),
  createdAt: z.number(),
  /** When the body was last edited, or null. */
  editedAt: z.number().nullable(),
});
export type Note = z.infer<typeof noteSchema>;
