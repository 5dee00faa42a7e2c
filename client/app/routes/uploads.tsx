import { useParams } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { uploadsQueryOptions } from '../../features/uploads/api/get-uploads';
import { UploadPanel } from '../../features/uploads/components/upload-panel';
import { roomPageLoader } from '../room-loader';

export const clientLoader = roomPageLoader((queryClient, roomId) => queryClient.prefetchQuery(uploadsQueryOptions(roomId)));

export default function UploadsRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  if (!room) return <Loading />;
  return (
    <div className="flex flex-col">
      <RoomHeader room={room} subtitle="Uploads" />
      <UploadPanel roomId={room.id} role={room.role} />
    </div>
  );
}
