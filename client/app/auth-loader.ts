import type { QueryClient } from '@tanstack/react-query';
import { redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { safeRedirect } from '../config/paths';
import { meQueryOptions } from '../features/auth/api/get-me';

/** The signed-out pages send someone already signed in straight on to where they were going. */
export async function redirectSignedIn(queryClient: QueryClient, { request }: LoaderFunctionArgs) {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me) throw redirect(safeRedirect(new URL(request.url).searchParams.get('redirectTo')));
}
