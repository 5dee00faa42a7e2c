import { useQuery } from '@tanstack/react-query';
import { roomsQueryOptions } from './get-rooms';
import type { RoomSummary } from './room';

/** Picks one room out of the user's room list; `null` when the user is not one of its members. */
export const roomFrom = (rooms: readonly RoomSummary[], roomId: string): RoomSummary | null =>
  rooms.find((room) => room.id === roomId) ?? null;

/**
 * One room and the signed-in user's role in it, read from the contract's `GET /api/rooms` (the
 * same cached query as the room list), so a room the user does not belong to is absent here
 * exactly as on the server.
 */
export const useRoom = (roomId: string) =>
  useQuery({ ...roomsQueryOptions(), select: (rooms) => roomFrom(rooms, roomId) });
