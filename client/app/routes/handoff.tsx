import { useParams } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { HandoffPanel } from '../../features/handoff/components/handoff-panel';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { roomLoader } from '../room-loader';

export const clientLoader = roomLoader;

export default function HandoffRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  if (!room) return <Loading />;
  return (
    <div className="flex flex-col">
      <RoomHeader room={room} subtitle="Hand-off" />
      <HandoffPanel roomId={room.id} />
    </div>
  );
}
