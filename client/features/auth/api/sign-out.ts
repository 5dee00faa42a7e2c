import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

/** `POST /api/auth/signout`: clears the session cookie. */
export const signOut = (): Promise<unknown> => api.post('/api/auth/signout');

/** After signing out nothing of the previous user stays cached; `me` becomes `null`. */
export function useSignOut(config: MutationConfig<typeof signOut> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: signOut,
    onSuccess: async (...args) => {
      queryClient.removeQueries();
      queryClient.setQueryData(queryKeys.me, null);
      await onSuccess?.(...args);
    },
  });
}
