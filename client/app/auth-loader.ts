import type { QueryClient } from '@tanstack/react-query';
import { redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { paths, safeRedirect } from '../config/paths';
import { meQueryOptions } from '../features/auth/api/get-me';

/** The signed-out pages send someone already signed in straight on to where they were going. */
export async function redirectSignedIn(queryClient: QueryClient, { request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me) throw redirect(safeRedirect(new URL(request.url).searchParams.get('redirectTo')));
}

/** Signed-out visitors go to sign in, and come back to this address afterwards. */
export async function requireSignedIn(queryClient: QueryClient, { request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  const url = new URL(request.url);
  if (!me) throw redirect(paths.auth.signIn.getHref(`${url.pathname}${url.search}`));
}

/**
 * React Router runs a page's loader alongside its layout's, so a page's data waits for the same
 * (shared, cached) `me` answer and is fetched only for a signed-in user; the layout redirects the others.
 */
export async function isSignedIn(queryClient: QueryClient): Promise<boolean> {
  return (await queryClient.ensureQueryData(meQueryOptions())) !== null;
}
