import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { meQueryOptions } from './get-me';

export const signInInputSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(z.email('Enter a valid e-mail address')),
  password: z.string().min(1, 'Enter your password'),
});

export type SignInInput = z.infer<typeof signInInputSchema>;

/** `POST /api/auth/signin`: sets the session cookie, or fails with 401. */
export const signIn = (input: SignInInput): Promise<unknown> => api.post('/api/auth/signin', input);

/** Signing in switches users: everything cached for the previous one goes, and `me` is fetched afresh. */
export function useSignIn(config: MutationConfig<typeof signIn> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: signIn,
    onSuccess: async (...args) => {
      queryClient.removeQueries();
      await queryClient.prefetchQuery(meQueryOptions());
      await onSuccess?.(...args);
    },
  });
}
