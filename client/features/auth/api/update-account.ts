import { useMutation, useQueryClient } from '@tanstack/react-query';
import { accountSchema, type Account } from '../../../../shared/api/account';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';

/** `PATCH /api/me` `{ notifyReviews }`: the account's settings. */
export const updateAccount = async (patch: { notifyReviews: boolean }): Promise<Account> =>
  parseResponse(accountSchema)(await api.patch('/api/me', patch));

export function useUpdateAccount(config: MutationConfig<typeof updateAccount> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: updateAccount,
    onSuccess: async (...args) => {
      queryClient.setQueryData(queryKeys.me, args[0]);
      await onSuccess?.(...args);
    },
  });
}
