import { useMutation, useQueryClient } from '@tanstack/react-query';
import { noteSchema, type Note, type NoteCreateBody } from '../../../../shared/api/notes';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { upsertById } from '../../../lib/use-room-live-data';

/** `POST /api/rooms/:id/notes` (any member, observers included): a new thread, or a reply (`parentId`). */
export const createNote = async ({ roomId, ...body }: NoteCreateBody & { roomId: string }): Promise<Note> =>
  parseResponse(noteSchema)(await api.post(`/api/rooms/${encodeURIComponent(roomId)}/notes`, body));

export function useCreateNote(roomId: string, config: MutationConfig<typeof createNote> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: createNote,
    onSuccess: async (...args) => {
      queryClient.setQueryData<Note[]>(queryKeys.rooms.notes(roomId), (list) => upsertById(list, args[0]));
      await onSuccess?.(...args);
    },
  });
}
