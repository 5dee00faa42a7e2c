import { useMutation, useQueryClient } from '@tanstack/react-query';
import { noteSchema, type Note } from '../../../../shared/api/notes';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { upsertById } from '../../../lib/use-room-live-data';

export interface UpdateNoteInput {
  roomId: string;
  noteId: string;
  body?: string;
  resolved?: boolean;
}

/** `PATCH /api/rooms/:id/notes/:noteId`: edit the body (author) or resolve / reopen a thread (author, owner, tuner). */
export const updateNote = async ({ roomId, noteId, ...patch }: UpdateNoteInput): Promise<Note> =>
  parseResponse(noteSchema)(await api.patch(`/api/rooms/${encodeURIComponent(roomId)}/notes/${encodeURIComponent(noteId)}`, patch));

export function useUpdateNote(roomId: string, config: MutationConfig<typeof updateNote> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: updateNote,
    onSuccess: async (...args) => {
      queryClient.setQueryData<Note[]>(queryKeys.rooms.notes(roomId), (list) => upsertById(list, args[0]));
      await onSuccess?.(...args);
    },
  });
}
