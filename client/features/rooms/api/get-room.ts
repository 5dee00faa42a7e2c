import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { roomSummarySchema, type RoomSummary } from './room';

/**
 * `GET /api/rooms/:id`: one room and the signed-in user's role in it. A room the user is not a
 * member of (or that does not exist) is a 404.
 */
export const getRoom = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<RoomSummary> =>
  parseResponse(roomSummarySchema)(await api.get(`/api/rooms/${encodeURIComponent(roomId)}`, { signal }));

export const roomQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.detail(roomId),
    queryFn: ({ signal }) => getRoom(roomId, { signal }),
    // The route's error boundary explains a 404 or 403; no notice on top of it.
    meta: { notice: false },
  });

export const useRoom = (roomId: string) => useQuery(roomQueryOptions(roomId));
