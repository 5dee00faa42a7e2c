import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

export const createRoomInputSchema = z.object({
  name: z.string().trim().min(1, 'Give the room a name').max(200, 'Keep the name under 200 characters'),
});

export type CreateRoomInput = z.infer<typeof createRoomInputSchema>;

const createdRoomSchema = z.looseObject({ id: z.string() });

/**
 * `POST /api/rooms`: 201 `{ id, ... }`; the creator is the room's owner. With `design` (an imported
 * `.matchloom.json`), the room starts from it; a bad design is a 400 whose message names its JSON path.
 */
export const createRoom = async (input: CreateRoomInput & { design?: unknown }): Promise<{ id: string }> =>
  parseResponse(createdRoomSchema)(await api.post('/api/rooms', input));

export function useCreateRoom(config: MutationConfig<typeof createRoom> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: createRoom,
    onSuccess: async (...args) => {
      await queryClient.invalidateQueries({ queryKey: queryKeys.rooms.all });
      await onSuccess?.(...args);
    },
  });
}
