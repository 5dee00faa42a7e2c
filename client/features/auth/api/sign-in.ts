import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { userSchema, type User } from './user';

export const signInInputSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(z.email('Enter a valid e-mail address')),
  password: z.string().min(1, 'Enter your password'),
});

export type SignInInput = z.infer<typeof signInInputSchema>;

/** `POST /api/auth/signin`: the user, with the session cookie set; or a 401. */
export const signIn = async (input: SignInInput): Promise<User> =>
  parseResponse(userSchema)(await api.post('/api/auth/signin', input));

/** Signing in switches users: everything cached for the previous one goes; `me` is the answer. */
export function useSignIn(config: MutationConfig<typeof signIn> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: signIn,
    onSuccess: async (...args) => {
      queryClient.removeQueries();
      queryClient.setQueryData(queryKeys.me, args[0]);
      await onSuccess?.(...args);
    },
  });
}
