/**
 * The query client and the shared types of the features' API files. Errors from queries and
 * mutations reach the notice area here, once, instead of from the HTTP client: a mutation whose
 * form shows its own errors opts out with `meta: { notice: false }`, and "not signed in" (401)
 * is handled by the routes (a redirect to sign-in), not announced.
 */
import {
  MutationCache,
  QueryCache,
  QueryClient,
  type DefaultOptions,
  type UseMutationOptions,
} from '@tanstack/react-query';
import { isApiError } from './api-client';
import { notices as defaultNotices, type NoticeStore } from './notices';
import { queryKeys } from './query-keys';

declare module '@tanstack/react-query' {
  interface Register {
    queryMeta: { notice?: boolean };
    mutationMeta: { notice?: boolean };
  }
}

const queryDefaults: DefaultOptions = {
  queries: {
    staleTime: 30_000,
    refetchOnWindowFocus: false,
    // A 4xx will not change by asking again; a network blip might.
    retry: (failureCount, error) => (isApiError(error) && error.status >= 400 && error.status < 500 ? false : failureCount < 2),
  },
};

const isSignedOut = (error: unknown) => isApiError(error) && error.status === 401;

function announce(store: NoticeStore, error: unknown) {
  if (isSignedOut(error)) return;
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  store.post({ tone: 'error', title: 'That did not work', message });
}

export function createQueryClient(store: NoticeStore = defaultNotices): QueryClient {
  // A 401 while someone is signed in means the session ended (signed out elsewhere, expired):
  // asking `me` again lets the layout send the user to sign in.
  const recheckSession = () => {
    if (client.getQueryData(queryKeys.me)) void client.invalidateQueries({ queryKey: queryKeys.me });
  };
  const client: QueryClient = new QueryClient({
    defaultOptions: queryDefaults,
    queryCache: new QueryCache({
      onError: (error, query) => {
        if (isSignedOut(error)) recheckSession();
        if (query.meta?.notice !== false) announce(store, error);
      },
    }),
    mutationCache: new MutationCache({
      onError: (error, _variables, _context, mutation) => {
        if (isSignedOut(error)) recheckSession();
        if (mutation.meta?.notice !== false) announce(store, error);
      },
    }),
  });
  return client;
}

/** The return type of a fetch function, unwrapped (as in the features' `queryOptions`). */
export type ApiFnReturnType<Fn extends (...args: never[]) => Promise<unknown>> = Awaited<ReturnType<Fn>>;

/** Options a feature's mutation hook accepts from its caller (everything but the mutation itself). */
export type MutationConfig<Fn extends (...args: never[]) => Promise<unknown>> = Omit<
  UseMutationOptions<ApiFnReturnType<Fn>, Error, Parameters<Fn>[0]>,
  'mutationFn'
>;
