import { useMutation, useQueryClient } from '@tanstack/react-query';
import { invitationAcceptResultSchema, type InvitationAcceptResult } from '../../../../shared/api/invitations';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

/** `POST /api/invitations/:token/accept` (signed in with the invited address): joins the room with the invited role. */
export const acceptInvitation = async ({ token }: { token: string }): Promise<InvitationAcceptResult> =>
  parseResponse(invitationAcceptResultSchema)(await api.post(`/api/invitations/${encodeURIComponent(token)}/accept`));

export function useAcceptInvitation(config: MutationConfig<typeof acceptInvitation> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: acceptInvitation,
    onSuccess: async (...args) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.all }),
        queryClient.invalidateQueries({ queryKey: queryKeys.invitation(args[1].token) }),
      ]);
      await onSuccess?.(...args);
    },
  });
}
