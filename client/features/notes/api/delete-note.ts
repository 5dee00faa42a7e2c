import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Note } from '../../../../shared/api/notes';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

/** `DELETE /api/rooms/:id/notes/:noteId` (author or owner); a thread's first note takes its replies. */
export const deleteNote = ({ roomId, noteId }: { roomId: string; noteId: string }): Promise<unknown> =>
  api.delete(`/api/rooms/${encodeURIComponent(roomId)}/notes/${encodeURIComponent(noteId)}`);

export function useDeleteNote(roomId: string, config: MutationConfig<typeof deleteNote> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: deleteNote,
    onSuccess: async (...args) => {
      const { noteId } = args[1];
      queryClient.setQueryData<Note[]>(queryKeys.rooms.notes(roomId), (list) => list?.filter((n) => n.id !== noteId && n.parentId !== noteId));
      await onSuccess?.(...args);
    },
  });
}
