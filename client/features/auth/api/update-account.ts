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
  const { onMutate, onSuccess, ...rest } = config;
  return useMutation({
    ...rest,
    mutationFn: updateAccount,
    onMutate: async (...args) => {
      // A read of the account already on its way (the page asks afresh when it opens) answers with the
      // settings from before this change; landing after it, it would put the old value back on screen.
      await queryClient.cancelQueries({ queryKey: queryKeys.me });
      return onMutate?.(...args);
    },
    onSuccess: async (...args) => {
      queryClient.setQueryData(queryKeys.me, args[0]);
      await onSuccess?.(...args);
    },
  });
}
