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
    design: (roomId: string) => ['rooms', 'detail', roomId, 'design'] as const,
    snapshots: (roomId: string) => ['rooms', 'detail', roomId, 'snapshots'] as const,
    lineage: (roomId: string) => ['rooms', 'detail', roomId, 'lineage'] as const,
    compare: (roomId: string, a: string, b: string) => ['rooms', 'detail', roomId, 'compare', a, b] as const,
    notes: (roomId: string) => ['rooms', 'detail', roomId, 'notes'] as const,
    uploads: (roomId: string) => ['rooms', 'detail', roomId, 'uploads'] as const,
  },
  /** One snapshot with its design (`GET /api/snapshots/:id`). */
  snapshot: (snapshotId: string) => ['snapshots', snapshotId] as const,
  /** What an invitation link shows; not under `rooms` (the visitor may not be signed in). */
  invitation: (token: string) => ['invitations', token] as const,
  mailbox: ['dev', 'mailbox'] as const,
};
