/**
 * Query keys, spelt once. They nest so that one invalidation reaches everything below it:
 * `rooms.all` covers the room list, each room, and each room's members.
 */
export const queryKeys = {
  me: ['me'] as const,
  health: ['health'] as const,
  rooms: {
    all: ['rooms'] as const,
    list: () => ['rooms', 'list'] as const,
    detail: (roomId: string) => ['rooms', 'detail', roomId] as const,
    members: (roomId: string) => ['rooms', 'detail', roomId, 'members'] as const,
    invitations: (roomId: string) => ['rooms', 'detail', roomId, 'invitations'] as const,
  },
};
