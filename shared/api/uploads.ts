/** Touchstone uploads: the list entry, the full upload, and `use`. */
import { z } from 'zod';
import { jsonBody, personSchema } from './common';

/** Largest upload (bytes); larger is 413 `too-large`. */
export const UPLOAD_MAX_BYTES = 5 * 1024 * 1024;
/** The multipart field that carries the file. */
export const UPLOAD_FIELD = 'file';

export const uploadSchema = z.object({
  id: z.string(),
  roomId: z.string(),
  fileName: z.string(),
  ports: z.number(),
  points: z.number(),
  startHz: z.number(),
  stopHz: z.number(),
  uploadedBy: personSchema.nullable(),
  createdAt: z.number(),
});
export type Upload = z.infer<typeof uploadSchema>;

export const uploadWithTextSchema = uploadSchema.extend({ text: z.string() });
export type UploadWithText = z.infer<typeof uploadWithTextSchema>;

/** `POST /api/rooms/:id/uploads/:uploadId/use`. `elementId` (two-port only) names the element to replace. */
export const uploadUseBodySchema = jsonBody({
  as: z.enum(['load', 'two-port'], { error: 'must be "load" or "two-port"' }),
  elementId: z
    .string({ error: 'must be a string' })
    .min(1, 'must not be empty')
    .max(100, 'must be at most 100 characters')
    .optional(),
});
export type UploadUseBody = z.infer<typeof uploadUseBodySchema>;

export const uploadUseResultSchema = z.object({
  roomId: z.string(),
  uploadId: z.string(),
  as: z.enum(['load', 'two-port']),
  /** The two-port element's id (new or replaced); null for a load. */
  elementId: z.string().nullable(),
  /** The sweep was narrowed to the measured range (it reached outside it). */
  sweepAdjusted: z.boolean(),
  design: z.unknown(),
});
export type UploadUseResult = z.infer<typeof uploadUseResultSchema>;
