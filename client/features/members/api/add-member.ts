import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { roomRoleSchema } from '../../../lib/room-role';
import { invitationSchema, memberSchema } from './member';

export const addMemberInputSchema = z.object({
  email: z.string().trim().min(1, 'Enter their e-mail address').pipe(z.email('Enter a valid e-mail address')),
  role: roomRoleSchema,
});

export type AddMemberInput = z.infer<typeof addMemberInputSchema>;

/** 201 with the new member, or 202 `{ invited: true, ... }` when no account has that address yet. */
const addMemberResultSchema = z.union([
  invitationSchema.extend({ invited: z.literal(true) }).transform((invitation) => ({ kind: 'invited' as const, invitation })),
  memberSchema.transform((member) => ({ kind: 'added' as const, member })),
]);

export type AddMemberResult = z.infer<typeof addMemberResultSchema>;

/** `POST /api/rooms/:id/members` (owner): adds the user, or records an invitation for the address. */
export const addMember = async ({ roomId, ...input }: AddMemberInput & { roomId: string }): Promise<AddMemberResult> =>
  parseResponse(addMemberResultSchema)(await api.post(`/api/rooms/${encodeURIComponent(roomId)}/members`, input));

export function useAddMember(roomId: string, config: MutationConfig<typeof addMember> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: addMember,
    onSuccess: async (...args) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.members(roomId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.invitations(roomId) }),
      ]);
      await onSuccess?.(...args);
    },
  });
}
