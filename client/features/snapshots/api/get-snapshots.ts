import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { snapshotSchema, type Snapshot } from '../../../../shared/api/snapshots';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type { Snapshot };

/** `GET /api/rooms/:id/snapshots` (any member): the room's snapshots, newest first, with their figures. */
export const getSnapshots = async (roomId: string, { signal }: { signal?: AbortSignal } = {}): Promise<Snapshot[]> =>
  parseResponse(z.array(snapshotSchema))(await api.get(`/api/rooms/${encodeURIComponent(roomId)}/snapshots`, { signal }));

export const snapshotsQueryOptions = (roomId: string) =>
  queryOptions({
    queryKey: queryKeys.rooms.snapshots(roomId),
    queryFn: ({ signal }) => getSnapshots(roomId, { signal }),
  });

/** `refetchInterval`: poll while the live stream is away. */
export const useSnapshots = (roomId: string, { refetchInterval = false }: { refetchInterval?: number | false } = {}) =>
  useQuery({ ...snapshotsQueryOptions(roomId), refetchInterval });
