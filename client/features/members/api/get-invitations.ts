import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { invitationSchema, type Invitation } from './member';

/** `GET /api/rooms/:id/invitations` (owner): addresses invited that have no account yet, newest first. */
export const getInvitations = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Invitation[]> =>
  parseResponse(z.array(invitationSchema))(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/invitations`, { signal }));

export const invitationsQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.invitations(roomId),
    queryFn: ({ signal }) => getInvitations(roomId, { signal }),
  });

/** Only an owner may read invitations: pass `enabled: false` for anyone else. */
export const useInvitations = (roomId: string, { enabled = true }: { enabled?: boolean } = {}) =>
  useQuery({ ...invitationsQueryOptions(roomId), enabled });
