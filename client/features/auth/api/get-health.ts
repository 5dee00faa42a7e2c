import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** `GET /api/health`: `ok` once the server is up; `demo: true` when it holds the demo accounts. */
export const healthSchema = z.looseObject({
  ok: z.boolean(),
  demo: z.boolean().optional(),
});

export type Health = z.infer<typeof healthSchema>;

export const getHealth = async ({ signal }: { signal?: AbortSignal } = {}): Promise<Health> =>
  parseResponse(healthSchema)(await api.get('/api/health', { signal }));

export const healthQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.health,
    queryFn: ({ signal }) => getHealth({ signal }),
    staleTime: Infinity,
    meta: { notice: false },
  });

export const useHealth = () => useQuery(healthQueryOptions());
