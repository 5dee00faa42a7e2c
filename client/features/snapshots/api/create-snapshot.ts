import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { snapshotSchema, type Snapshot } from '../../../../shared/api/snapshots';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { upsertById } from '../../../lib/use-room-live-data';

export const createSnapshotInputSchema = z.object({
  label: z.string().trim().min(1, 'Give the snapshot a label').max(200, 'Keep the label under 200 characters'),
  forReview: z.boolean(),
});

export type CreateSnapshotInput = z.infer<typeof createSnapshotInputSchema>;

/** `POST /api/rooms/:id/snapshots` (owner, tuner): saves the room's design now, with its figures. */
export const createSnapshot = async ({ roomId, ...input }: CreateSnapshotInput & { roomId: string }): Promise<Snapshot> =>
  parseResponse(snapshotSchema)(await api.post(`/api/rooms/${encodeURIComponent(roomId)}/snapshots`, input));

export function useCreateSnapshot(roomId: string, config: MutationConfig<typeof createSnapshot> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: createSnapshot,
    onSuccess: async (...args) => {
      queryClient.setQueryData<Snapshot[]>(queryKeys.rooms.snapshots(roomId), (list) => upsertById(list, args[0], true));
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.snapshots(roomId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.rooms.lineage(roomId) }),
      ]);
      await onSuccess?.(...args);
    },
  });
}
