import { useMutation, useQueryClient } from '@tanstack/react-query';
import { UPLOAD_FIELD, uploadSchema, type Upload } from '../../../../shared/api/uploads';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { upsertById } from '../../../lib/use-room-live-data';

/**
 * `POST /api/rooms/:id/uploads` (owner, tuner; multipart, field `file`): a `.s1p` or `.s2p` file.
 * 201 with its ports, points and range; 400 naming the line of a file that does not parse; 413 past 5 MiB.
 */
export async function uploadTouchstone({ roomId, file }: { roomId: string; file: File }): Promise<Upload> {
  const form = new FormData();
  form.append(UPLOAD_FIELD, file, file.name);
  return parseResponse(uploadSchema)(await api.post(`/api/rooms/${encodeURIComponent(roomId)}/uploads`, form));
}

export function useUploadTouchstone(roomId: string, config: MutationConfig<typeof uploadTouchstone> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: uploadTouchstone,
    onSuccess: async (...args) => {
      queryClient.setQueryData<Upload[]>(queryKeys.rooms.uploads(roomId), (list) => upsertById(list, args[0], true));
      await onSuccess?.(...args);
    },
  });
}
