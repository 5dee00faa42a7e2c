import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { memberSchema, type Member } from './member';

/** `GET /api/rooms/:id/members`: the room's members, earliest first (any member may read it). */
export const getMembers = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Member[]> =>
  parseResponse(z.array(memberSchema))(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/members`, { signal }));

export const membersQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.members(roomId),
    queryFn: ({ signal }) => getMembers(roomId, { signal }),
  });

export const useMembers = (roomId: string) => useQuery(membersQueryOptions(roomId));
