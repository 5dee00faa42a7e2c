import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { MutationConfig } from '../../../lib/react-query';

/** `POST /api/auth/signout`: clears the session cookie. */
export const signOut = (): Promise<unknown> => api.post('/api/auth/signout');

/**
 * Signing out. The caller then loads the sign-in page afresh (`window.location.assign`), which drops
 * every cached answer and every open room connection of the previous user at once; clearing the
 * cache here first would only make the signed-in pages flash a redirect of their own.
 */
export function useSignOut(config: MutationConfig<typeof signOut> = {}) {
  return useMutation({ ...config, mutationFn: signOut });
}
