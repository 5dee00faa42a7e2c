import type { Note } from '../../../../shared/api/notes';
import type { RoomRole } from '../../../lib/room-role';

/** The server's rules, mirrored so the panel offers only what will be accepted (the server still decides). */
export const canResolveNote = (root: Note, userId: string | null, role: RoomRole) =>
  root.parentId === null && (role === 'owner' || role === 'tuner' || (userId !== null && root.author?.id === userId));

export const canDeleteNote = (note: Note, userId: string | null, role: RoomRole) =>
  role === 'owner' || (userId !== null && note.author?.id === userId);
