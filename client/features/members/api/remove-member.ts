import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

/** `DELETE /api/rooms/:id/members/:userId` (owner): removes someone from the room. */
export const removeMember = ({ roomId, userId }: { roomId: string; userId: string }): Promise<unknown> =>
  api.delete(`/api/rooms/${encodeURIComponent(roomId)}/members/${encodeURIComponent(userId)}`);

export function useRemoveMember(roomId: string, config: MutationConfig<typeof removeMember> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: removeMember,
    onSuccess: async (...args) => {
      await queryClient.invalidateQueries({ queryKey: queryKeys.rooms.members(roomId) });
      await onSuccess?.(...args);
    },
  });
}
