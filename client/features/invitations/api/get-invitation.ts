import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationPreviewSchema, type InvitationPreview } from '../../../../shared/api/invitations';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type { InvitationPreview };

/** `GET /api/invitations/:token` (anyone with the link): the room, role, invited address, inviter and state. */
export const getInvitation = async (token: string, { signal }: { signal?: AbortSignal } = {}): Promise<InvitationPreview> =>
  parseResponse(invitationPreviewSchema)(await api.get(`/api/invitations/${encodeURIComponent(token)}`, { signal }));

export const invitationQueryOptions = (token: string) =>
  queryOptions({
    queryKey: queryKeys.invitation(token),
    queryFn: ({ signal }) => getInvitation(token, { signal }),
    // The page explains a link that names no invitation.
    meta: { notice: false },
  });

export const useInvitation = (token: string) => useQuery(invitationQueryOptions(token));
