import { queryOptions, useQuery } from '@tanstack/react-query';
import { lineageSchema, type Lineage } from '../../../../shared/api/lineage';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type { Lineage };

/** `GET /api/rooms/:id/lineage` (any member): the tree of rooms and snapshots this room belongs to. */
export const getLineage = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Lineage> =>
  parseResponse(lineageSchema)(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/lineage`, { signal }));

export const lineageQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.lineage(roomId),
    queryFn: ({ signal }) => getLineage(roomId, { signal }),
  });

export const useLineage = (roomId: string) => useQuery(lineageQueryOptions(roomId));
