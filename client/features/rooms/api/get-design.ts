import { queryOptions, useQuery } from '@tanstack/react-query';
import { safeParseDesign, type Design } from '../../../../shared/rf/design';
import { ApiError, api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** `GET /api/rooms/:id/design` (any member): the room's design file now, checked with the design schema. */
export async function getDesign(roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Design> {
  const parsed = safeParseDesign(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/design`, { signal }));
  if (!parsed.ok) throw new ApiError(0, 'bad-response', `The room’s design could not be read: ${parsed.error.message}`);
  return parsed.design;
}

export const designQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.design(roomId),
    queryFn: ({ signal }) => getDesign(roomId, { signal }),
  });

export const useDesign = (roomId: string) => useQuery(designQueryOptions(roomId));
