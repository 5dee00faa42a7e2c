import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { invitationSchema, memberSchema, type Invitation, type Member } from './member';

const membersResponseSchema = z.union([
  z.array(memberSchema).transform((members) => ({ members, invitations: [] as Invitation[] })),
  z.object({
    members: z.array(memberSchema),
    invitations: z.array(invitationSchema).optional().default([]),
  }),
]);

export interface RoomMembers {
  members: Member[];
  invitations: Invitation[];
}

/** `GET /api/rooms/:id/members`: the room's members (any member may read it) and pending invitations. */
export const getMembers = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<RoomMembers> =>
  parseResponse(membersResponseSchema)(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/members`, { signal }));

export const membersQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.members(roomId),
    queryFn: ({ signal }) => getMembers(roomId, { signal }),
  });

export const useMembers = (roomId: string) => useQuery(membersQueryOptions(roomId));
