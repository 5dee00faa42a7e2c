import { useParams } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { snapshotsQueryOptions } from '../../features/snapshots/api/get-snapshots';
import { SnapshotsPanel } from '../../features/snapshots/components/snapshots-panel';
import { roomPageLoader } from '../room-loader';
import type { RouteHandle } from '../router';

export const clientLoader = roomPageLoader((queryClient, roomId) => queryClient.prefetchQuery(snapshotsQueryOptions(roomId)));

/** Eight columns read best with some width. */
export const handle: RouteHandle = { wide: true };

export default function SnapshotsRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  if (!room) return <Loading />;
  return (
    <div className="mx-auto flex w-full max-w-7xl flex-col">
      <RoomHeader room={room} subtitle="Snapshots" />
      <SnapshotsPanel roomId={room.id} role={room.role} />
    </div>
  );
}
