import { useMutation, useQueryClient } from '@tanstack/react-query';
import { snapshotSchema, type Snapshot } from '../../../../shared/api/snapshots';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { upsertById } from '../../../lib/use-room-live-data';

export interface UpdateSnapshotInput {
  snapshotId: string;
  label?: string;
  forReview?: boolean;
}

/** `PATCH /api/snapshots/:id` (owner, tuner): renames it or marks it for review (which mails the reviewers). */
export const updateSnapshot = async ({ snapshotId, ...patch }: UpdateSnapshotInput): Promise<Snapshot> =>
  parseResponse(snapshotSchema)(await api.patch(`/api/snapshots/${encodeURIComponent(snapshotId)}`, patch));

export function useUpdateSnapshot(roomId: string, config: MutationConfig<typeof updateSnapshot> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: updateSnapshot,
    onSuccess: async (...args) => {
      queryClient.setQueryData<Snapshot[]>(queryKeys.rooms.snapshots(roomId), (list) => upsertById(list, args[0], true));
      await onSuccess?.(...args);
    },
  });
}
