import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { noteSchema, type Note } from '../../../../shared/api/notes';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type { Note };

/** `GET /api/rooms/:id/notes` (any member): every note and reply, oldest first. */
export const getNotes = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Note[]> =>
  parseResponse(z.array(noteSchema))(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/notes`, { signal }));

export const notesQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.notes(roomId),
    queryFn: ({ signal }) => getNotes(roomId, { signal }),
  });

/** `refetchInterval`: poll while the live stream is away. */
export const useNotes = (roomId: string, { refetchInterval = false }: { refetchInterval?: number | false } = {}) =>
  useQuery({ ...notesQueryOptions(roomId), refetchInterval });
