import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { roomRoleSchema } from '../../../lib/room-role';

export const addMemberInputSchema = z.object({
  email: z.string().trim().min(1, 'Enter their e-mail address').pipe(z.email('Enter a valid e-mail address')),
  role: roomRoleSchema,
});

export type AddMemberInput = z.infer<typeof addMemberInputSchema>;

/** `POST /api/rooms/:id/members` (owner): adds the user, or invites the address by e-mail. */
export const addMember = ({ roomId, ...input }: AddMemberInput & { roomId: string }): Promise<unknown> =>
  api.post(`/api/rooms/${encodeURIComponent(roomId)}/members`, input);

export function useAddMember(roomId: string, config: MutationConfig<typeof addMember> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: addMember,
    onSuccess: async (...args) => {
      await queryClient.invalidateQueries({ queryKey: queryKeys.rooms.members(roomId) });
      await onSuccess?.(...args);
    },
  });
}
