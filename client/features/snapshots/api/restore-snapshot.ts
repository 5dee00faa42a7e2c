import { useMutation, useQueryClient } from '@tanstack/react-query';
import { restoreResultSchema, type RestoreResult } from '../../../../shared/api/snapshots';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

/**
 * `POST /api/rooms/:id/snapshots/:snapshotId/restore` (owner, tuner): writes the snapshot's design
 * over the room as one edit that everyone in the room sees; the state before it is kept as a snapshot.
 */
export const restoreSnapshot = async ({ roomId, snapshotId }: { roomId: string; snapshotId: string }): Promise<RestoreResult> =>
  parseResponse(restoreResultSchema)(
    await api.post(`/api/rooms/${encodeURIComponent(roomId)}/snapshots/${encodeURIComponent(snapshotId)}/restore`),
  );

export function useRestoreSnapshot(roomId: string, config: MutationConfig<typeof restoreSnapshot> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: restoreSnapshot,
    onSuccess: async (...args) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.snapshots(roomId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.design(roomId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.lineage(roomId) }),
      ]);
      await onSuccess?.(...args);
    },
  });
}
