import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { meQueryOptions } from './get-me';

export const PASSWORD_MIN_LENGTH = 8;

export const signUpInputSchema = z.object({
  displayName: z.string().trim().min(1, 'Enter the name your team will see').max(120, 'Keep the name under 120 characters'),
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(z.email('Enter a valid e-mail address')),
  password: z
    .string()
    .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
    .max(200, 'Keep the password under 200 characters'),
});

export type SignUpInput = z.infer<typeof signUpInputSchema>;

/** `POST /api/auth/signup`: creates the account (201) and signs it in. */
export const signUp = (input: SignUpInput): Promise<unknown> => api.post('/api/auth/signup', input);

export function useSignUp(config: MutationConfig<typeof signUp> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: signUp,
    onSuccess: async (...args) => {
      queryClient.removeQueries();
      await queryClient.prefetchQuery(meQueryOptions());
      await onSuccess?.(...args);
    },
  });
}
