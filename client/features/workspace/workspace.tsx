/**
 * The room workspace: the screen RF engineers live in during a call. The room route renders it
 * lazily with the room id and the signed-in user's role in that room.
 */
export type RoomRole = 'owner' | 'tuner' | 'observer';

export interface WorkspaceProps {
  roomId: string;
  role: RoomRole;
}

export default function Workspace({ roomId, role }: WorkspaceProps) {
  return (
    <main aria-label="Room workspace" data-room-id={roomId} data-role={role} className="p-4">
      <p role="status">Opening the room…</p>
    </main>
  );
}
