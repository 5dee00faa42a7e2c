import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { ApiError } from '../lib/api-client';
import { roomFrom } from '../features/rooms/api/get-room';
import { roomsQueryOptions } from '../features/rooms/api/get-rooms';

/** A room the user is not a member of is a 404, as the server answers for it. */
export const roomLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  const rooms = await queryClient.ensureQueryData(roomsQueryOptions());
  if (!roomFrom(rooms, params.roomId ?? ''))
    throw new ApiError(404, 'room-not-found', 'There is no such room, or you are not one of its members.');
  return null;
};
