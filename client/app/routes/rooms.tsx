import type { QueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../config/paths';
import { roomsQueryOptions, useRooms } from '../../features/rooms/api/get-rooms';
import { CreateRoomForm } from '../../features/rooms/components/create-room-form';
import { RoomList } from '../../features/rooms/components/room-list';
import { Loading } from '../../components/page-status';

export const clientLoader = (queryClient: QueryClient) => async () => {
  await queryClient.ensureQueryData(roomsQueryOptions());
  return null;
};

export default function RoomsRoute() {
  const navigate = useNavigate();
  const rooms = useRooms();
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="new-room-title" className="rounded-2xl border border-rule bg-card p-5 shadow-xs">
        <h1 id="new-room-title" className="mb-1 text-xl font-extrabold">
          Start a room
        </h1>
        <p className="mb-4 text-sm text-ink-soft">A room holds one matching design: a load, a chain of elements and a port. You will be its owner.</p>
        <CreateRoomForm onCreated={(roomId) => navigate(paths.room.getHref(roomId))} />
      </section>
      <section aria-labelledby="rooms-title">
        <h2 id="rooms-title" className="mb-3 text-xl font-extrabold">
          Your rooms
        </h2>
        {rooms.data ? <RoomList rooms={rooms.data} /> : <Loading label="Loading your rooms…" />}
      </section>
    </div>
  );
}
