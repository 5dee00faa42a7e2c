import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

export const branchInputSchema = z.object({
  name: z.string().trim().min(1, 'Give the branch a name').max(200, 'Keep the name under 200 characters'),
  copyMembers: z.boolean(),
});

export type BranchInput = z.infer<typeof branchInputSchema>;

const branchResultSchema = z.looseObject({ roomId: z.string() });

/** `POST /api/snapshots/:id/branch` (owner, tuner): a new room seeded from the snapshot; the caller owns it. */
export const branchSnapshot = async ({ snapshotId, ...input }: BranchInput & { snapshotId: string }): Promise<{ roomId: string }> =>
  parseResponse(branchResultSchema)(await api.post(`/api/snapshots/${encodeURIComponent(snapshotId)}/branch`, input));

export function useBranchSnapshot(roomId: string, config: MutationConfig<typeof branchSnapshot> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: branchSnapshot,
    onSuccess: async (...args) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.list() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.lineage(roomId) }),
      ]);
      await onSuccess?.(...args);
    },
  });
}
