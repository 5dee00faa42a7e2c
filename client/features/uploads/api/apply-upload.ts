import { useMutation, useQueryClient } from '@tanstack/react-query';
import { uploadUseResultSchema, type UploadUseResult } from '../../../../shared/api/uploads';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { createSnapshot } from '../../snapshots/api/create-snapshot';
import type { Snapshot } from '../../snapshots/api/get-snapshots';

export interface ApplyUploadInput {
  roomId: string;
  uploadId: string;
  as: 'load' | 'two-port';
  /** Two-port only: the element to replace (else a new element is added at the port end). */
  elementId?: string;
  /** Keep the room's design as a snapshot with this label first, so old and new can be compared. */
  snapshotFirst?: string;
}

export interface ApplyUploadOutcome extends UploadUseResult {
  /** The snapshot kept before the change (when asked for). */
  before: Snapshot | null;
}

/**
 * `POST /api/rooms/:id/uploads/:uploadId/use` (owner, tuner): the measurement becomes the load, or a
 * two-port element, as one edit everyone sees. With `snapshotFirst`, the design is kept as a snapshot
 * just before (two requests, one step for the user).
 */
export async function applyUpload({ roomId, uploadId, as, elementId, snapshotFirst }: ApplyUploadInput): Promise<ApplyUploadOutcome> {
  const before = snapshotFirst ? await createSnapshot({ roomId, label: snapshotFirst, forReview: false }) : null;
  const result = parseResponse(uploadUseResultSchema)(
    await api.post(`/api/rooms/${encodeURIComponent(roomId)}/uploads/${encodeURIComponent(uploadId)}/use`, { as, ...(elementId ? { elementId } : {}) }),
  );
  return { ...result, before };
}

export function useApplyUpload(roomId: string, config: MutationConfig<typeof applyUpload> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: applyUpload,
    onSuccess: async (...args) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.design(roomId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.snapshots(roomId) }),
      ]);
      await onSuccess?.(...args);
    },
  });
}
