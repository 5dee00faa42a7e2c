import { lazy, Suspense } from 'react';
import { useParams } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { roomLoader } from '../room-loader';
import type { RouteHandle } from '../router';

const Workspace = lazy(() => import('../../features/workspace/workspace'));

export const clientLoader = roomLoader;

/** The workspace wants the whole window. */
export const handle: RouteHandle = { wide: true };

export default function RoomRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  if (!room) return <Loading />;
  return (
    <div className="flex flex-col">
      <RoomHeader room={room} />
      {/* A plain frame, so tests can find the workspace whatever it draws inside. */}
      <div data-testid="room-workspace" data-room-id={room.id}>
        <Suspense fallback={<Loading label="Loading the workspace…" />}>
          <Workspace roomId={room.id} role={room.role} />
        </Suspense>
      </div>
    </div>
  );
}
