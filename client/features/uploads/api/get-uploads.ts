import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { uploadSchema, type Upload } from '../../../../shared/api/uploads';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type { Upload };

/** `GET /api/rooms/:id/uploads` (any member): the room's Touchstone uploads, newest first. */
export async function getUploads(roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Upload[]> {
  const uploads = parseResponse(z.array(uploadSchema))(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/uploads`, { signal }));
  return [...uploads].sort((a, b) => b.createdAt - a.createdAt);
}

export const uploadsQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.uploads(roomId),
    queryFn: ({ signal }) => getUploads(roomId, { signal }),
  });

export const useUploads = (roomId: string, { refetchInterval = false }: { refetchInterval?: number | false } = {}) =>
  useQuery({ ...uploadsQueryOptions(roomId), refetchInterval });
