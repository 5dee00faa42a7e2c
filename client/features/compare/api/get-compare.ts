import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import type { DesignDiff } from '../../../../shared/api/design-diff';
import { safeParseDesign, type Design } from '../../../../shared/rf/design';
import { ApiError, api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

const fieldChangeSchema = z.object({ path: z.string(), old: z.unknown().optional(), new: z.unknown().optional() });
const placedSchema = z.object({ id: z.string(), index: z.number(), element: z.looseObject({ id: z.string(), kind: z.string() }) });

/** The server's `DesignDiff` (shared/api/design-diff.ts), checked loosely: elements are checked with the designs. */
const diffSchema = z.object({
  fields: z.array(fieldChangeSchema),
  added: z.array(placedSchema),
  removed: z.array(placedSchema),
  changed: z.array(z.object({ id: z.string(), kind: z.string(), changes: z.array(fieldChangeSchema) })),
  moved: z.array(z.object({ id: z.string(), fromIndex: z.number(), toIndex: z.number() })),
  identical: z.boolean(),
});

const sideSchema = z.object({
  ref: z.string(),
  kind: z.enum(['live', 'snapshot']),
  roomId: z.string(),
  label: z.string(),
  createdAt: z.number().nullable(),
  design: z.unknown(),
});

const compareSchema = z.object({ a: sideSchema, b: sideSchema, diff: diffSchema });

export interface CompareSideView extends Omit<z.infer<typeof sideSchema>, 'design'> {
  design: Design;
}

export interface Comparison {
  a: CompareSideView;
  b: CompareSideView;
  diff: DesignDiff;
}

function checkedSide(side: z.infer<typeof sideSchema>): CompareSideView {
  const parsed = safeParseDesign(side.design);
  if (!parsed.ok) throw new ApiError(0, 'bad-response', `The design of “${side.label}” could not be read: ${parsed.error.message}`);
  return { ...side, design: parsed.design };
}

/** `GET /api/rooms/:id/compare?a=&b=` (any member): both designs (`live` or a snapshot) and what changed from a to b. */
export async function getComparison(roomId: string, a: string, b: string, { signal }: { signal?: AbortSignal } = {}): Promise<Comparison> {
  const query = new URLSearchParams({ a, b });
  const raw = parseResponse(compareSchema)(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/compare?${query}`, { signal }));
  return { a: checkedSide(raw.a), b: checkedSide(raw.b), diff: raw.diff as DesignDiff };
}

export const comparisonQueryOptions = (roomId: string, a: string, b: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.compare(roomId, a, b),
    queryFn: ({ signal }) => getComparison(roomId, a, b, { signal }),
    // The page says what went wrong (a missing snapshot, a bad reference) itself.
    meta: { notice: false },
    staleTime: 5_000,
  });

export const useComparison = (roomId: string, a: string, b: string) => useQuery(comparisonQueryOptions(roomId, a, b));
