import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { ApiError, isApiError } from '../lib/api-client';
import { roomQueryOptions } from '../features/rooms/api/get-room';
import { isSignedIn } from './auth-loader';

/**
 * The room pages need the room (and the user's role in it) first. The server answers 404 alike for
 * a room that does not exist and one the user is not in; the route's error boundary says both.
 */
export const roomLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (!(await isSignedIn(queryClient))) return null;
    try {
      await queryClient.ensureQueryData(roomQueryOptions(params.roomId ?? ''));
    } catch (error) {
      if (isApiError(error) && error.status === 404)
        throw new ApiError(404, error.code, 'There is no such room, or you are not one of its members. Ask its owner to add you.');
      throw error;
    }
    return null;
  };

/**
 * A room page's loader: the room first (as `roomLoader`), and alongside it whatever the page
 * prefetches (`prefetch(roomId)`, which must not throw: use `prefetchQuery`).
 */
export const roomPageLoader =
  (prefetch: (queryClient: QueryClient, roomId: string) => Promise<unknown>) =>
  (queryClient: QueryClient) =>
  async (args: LoaderFunctionArgs) => {
    if (!(await isSignedIn(queryClient))) return null;
    await Promise.all([roomLoader(queryClient)(args), prefetch(queryClient, args.params.roomId ?? '')]);
    return null;
  };
