/** `GET /api/rooms/:id/compare?a=<snapshotId|live>&b=<snapshotId|live>`: both designs and their differences. */
import { z } from 'zod';
import type { DesignDiff } from './design-diff';

export const LIVE_REF = 'live';

/** One side: `live` (this room now) or a snapshot id. */
export const compareRefSchema = z
  .string({ error: 'must be "live" or a snapshot id' })
  .min(1, 'must be "live" or a snapshot id')
  .max(64, 'must be "live" or a snapshot id')
  .regex(/^[A-Za-z0-9_-]+$/, 'must be "live" or a snapshot id');

export const compareQuerySchema = z.object(
  { a: compareRefSchema, b: compareRefSchema },
  { error: 'give ?a=<snapshot id or live>&b=<snapshot id or live>' },
);

export interface CompareSide {
  ref: string;
  kind: 'live' | 'snapshot';
  /** The room the design belongs to. */
  roomId: string;
  /** The snapshot's label, or the room's name for `live`. */
  label: string;
  /** Snapshot time, or null for `live`. */
  createdAt: number | null;
  /** The design file (CONTRACT §2). */
  design: unknown;
}

export interface CompareResult {
  a: CompareSide;
  b: CompareSide;
  /** What changed going from a to b. */
  diff: DesignDiff;
}
