import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import type { RoomRole } from '../../../lib/room-role';

/** `PATCH /api/rooms/:id/members/:userId` (owner): changes a role, effective at once. */
export const updateMemberRole = ({ roomId, userId, role }: { roomId: string; userId: string; role: RoomRole }): Promise<unknown> =>
  api.patch(`/api/rooms/${encodeURIComponent(roomId)}/members/${encodeURIComponent(userId)}`, { role });

export function useUpdateMemberRole(roomId: string, config: MutationConfig<typeof updateMemberRole> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: updateMemberRole,
    onSuccess: async (...args) => {
      // The owner may have changed their own role, which the room list and the room carry too.
      await queryClient.invalidateQueries({ queryKey: queryKeys.rooms.all });
      await onSuccess?.(...args);
    },
  });
}
