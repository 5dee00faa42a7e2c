import type { QueryClient } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../config/paths';
import { roomsQueryOptions, useRooms } from '../../features/rooms/api/get-rooms';
import { CreateRoomForm } from '../../features/rooms/components/create-room-form';
import { ImportDesignForm } from '../../features/rooms/components/import-design-form';
import { RoomList } from '../../features/rooms/components/room-list';
import { Loading } from '../../components/page-status';
import { isSignedIn } from '../auth-loader';

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await isSignedIn(queryClient)) await queryClient.ensureQueryData(roomsQueryOptions());
  return null;
};

export default function RoomsRoute() {
  const navigate = useNavigate();
  const rooms = useRooms();
  return (
    <div className="flex flex-col gap-6">
      <header>
        <h1 className="text-2xl font-extrabold tracking-tight sm:text-3xl">Your rooms</h1>
        <p className="mt-1 text-ink-soft">Every room you belong to, the one changed most recently first.</p>
      </header>
      <section aria-labelledby="new-room-title" className="rounded-2xl border border-rule bg-card p-5 shadow-xs">
        <h2 id="new-room-title" className="mb-1 text-lg font-extrabold">
          Start a room
        </h2>
        <p className="mb-4 text-sm text-ink-soft">A room holds one matching design: a load, a chain of elements and a port. You will be its owner.</p>
        <CreateRoomForm onCreated={(roomId) => navigate(paths.room.getHref(roomId))} />
      </section>
      <section aria-labelledby="import-design-title" className="rounded-2xl border border-rule bg-card p-5 shadow-xs">
        <h2 id="import-design-title" className="mb-1 text-lg font-extrabold">
          Import a design file
        </h2>
        <p className="mb-4 text-sm text-ink-soft">
          Start a room from a <code className="numeric">.matchloom.json</code> (a hand-off pack holds one). You will be its owner.
        </p>
        <ImportDesignForm onCreated={(roomId) => navigate(paths.room.getHref(roomId))} />
      </section>
      <section aria-label="Room list">
        {rooms.data ? <RoomList rooms={rooms.data} /> : <Loading label="Loading your rooms…" />}
      </section>
    </div>
  );
}
