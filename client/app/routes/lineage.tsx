import { useParams } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { lineageQueryOptions, useLineage } from '../../features/lineage/api/get-lineage';
import { LineageTree } from '../../features/lineage/components/lineage-tree';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { useRoomLiveData } from '../../lib/use-room-live-data';
import { roomPageLoader } from '../room-loader';

export const clientLoader = roomPageLoader((queryClient, roomId) => queryClient.prefetchQuery(lineageQueryOptions(roomId)));

export default function LineageRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  const lineage = useLineage(roomId);
  useRoomLiveData(roomId);
  if (!room) return <Loading />;
  return (
    <div className="flex flex-col">
      <RoomHeader room={room} subtitle="Lineage" />
      {lineage.data ? (
        <LineageTree lineage={lineage.data} />
      ) : lineage.isError ? (
        <p role="alert" className="text-coral-deep">
          {lineage.error.message}
        </p>
      ) : (
        <Loading label="Loading the lineage…" />
      )}
    </div>
  );
}
