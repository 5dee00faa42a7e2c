import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { userSchema, type User } from './user';

/** `GET /api/me`: the signed-in user, or `null` when nobody is signed in (401). */
export async function getMe({ signal }: { signal?: AbortSignal } = {}): Promise<User | null> {
  try {
    return parseResponse(userSchema)(await api.get('/api/me', { signal }));
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.me,
    queryFn: ({ signal }) => getMe({ signal }),
    staleTime: 5 * 60_000,
  });

export const useMe = () => useQuery(meQueryOptions());
