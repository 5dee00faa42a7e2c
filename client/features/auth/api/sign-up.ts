import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';
import { queryKeys } from '../../../lib/query-keys';
import { userSchema, type User } from './user';

/** The server's rules (server/auth/passwords.ts): at least 10 characters, at most 72 bytes. */
export const PASSWORD_MIN_LENGTH = 10;
const PASSWORD_MAX_BYTES = 72;

export const signUpInputSchema = z.object({
  displayName: z.string().trim().min(1, 'Enter the name your team will see').max(80, 'Keep the name to 80 characters or fewer'),
  email: z.string().trim().min(1, 'Enter your e-mail address').pipe(z.email('Enter a valid e-mail address')),
  password: z
    .string()
    .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
    .refine((p) => new TextEncoder().encode(p).length <= PASSWORD_MAX_BYTES, `Keep the password to ${PASSWORD_MAX_BYTES} bytes or fewer`),
});

export type SignUpInput = z.infer<typeof signUpInputSchema>;

/** `POST /api/auth/signup`: creates the account (201) and signs it in. */
export const signUp = async (input: SignUpInput): Promise<User> =>
  parseResponse(userSchema)(await api.post('/api/auth/signup', input));

export function useSignUp(config: MutationConfig<typeof signUp> = {}) {
  const queryClient = useQueryClient();
  const { onSuccess, ...rest } = config;
  return useMutation({
    meta: { notice: false },
    ...rest,
    mutationFn: signUp,
    onSuccess: async (...args) => {
      queryClient.removeQueries();
      queryClient.setQueryData(queryKeys.me, args[0]);
      await onSuccess?.(...args);
    },
  });
}
