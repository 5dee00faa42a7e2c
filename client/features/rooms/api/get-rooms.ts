import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import { dateFrom } from '../../../lib/format-time';
import { queryKeys } from '../../../lib/query-keys';
import { roomSummarySchema, type RoomSummary } from './room';

/** `GET /api/rooms`: the rooms the signed-in user belongs to, most recently updated first. */
export async function getRooms({ signal }: { signal?: AbortSignal } = {}): Promise<RoomSummary[]> {
  const rooms = parseResponse(z.array(roomSummarySchema))(await api.get('/api/rooms', { signal }));
  const changed = (room: RoomSummary) => dateFrom(room.updatedAt)?.getTime() ?? 0;
  return [...rooms].sort((a, b) => changed(b) - changed(a));
}

export const roomsQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.rooms.list(),
    queryFn: ({ signal }) => getRooms({ signal }),
  });

export const useRooms = () => useQuery(roomsQueryOptions());
