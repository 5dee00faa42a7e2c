import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { roomSummarySchema, type RoomSummary } from './room';

const roomsResponseSchema = z.union([
  z.array(roomSummarySchema),
  z.object({ rooms: z.array(roomSummarySchema) }).transform((body) => body.rooms),
]);

/** `GET /api/rooms`: the rooms the signed-in user belongs to, most recently updated first. */
export async function getRooms({ signal }: { signal?: AbortSignal } = {}): Promise<RoomSummary[]> {
  const rooms = parseResponse(roomsResponseSchema)(await api.get('/api/rooms', { signal }));
  return [...rooms].sort((a, b) => timeValue(b.updatedAt) - timeValue(a.updatedAt));
}

function timeValue(time: number | string | undefined): number {
  if (time === undefined) return 0;
  const value = typeof time === 'number' ? time : Date.parse(time);
  return Number.isFinite(value) ? value : 0;
}

export const roomsQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.rooms.list(),
    queryFn: ({ signal }) => getRooms({ signal }),
  });

export const useRooms = () => useQuery(roomsQueryOptions());
