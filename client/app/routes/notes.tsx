import { useParams } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { notesQueryOptions } from '../../features/notes/api/get-notes';
import { NotesPanel } from '../../features/notes/components/notes-panel';
import { elementName } from '../../features/compare/components/diff-rows';
import { useDesign } from '../../features/rooms/api/get-design';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { roomPageLoader } from '../room-loader';

export const clientLoader = roomPageLoader((queryClient, roomId) => queryClient.prefetchQuery(notesQueryOptions(roomId)));

export default function NotesRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  // The chain now: the elements a note may be pinned to, by name.
  const design = useDesign(roomId);
  const elements = design.data?.elements;
  if (!room) return <Loading />;
  return (
    <div className="flex max-w-3xl flex-col">
      <RoomHeader room={room} subtitle="Notes" />
      <NotesPanel
        roomId={room.id}
        role={room.role}
        elementIds={elements?.map((e) => e.id)}
        elementLabels={elements ? Object.fromEntries(elements.map((e) => [e.id, elementName(e)])) : undefined}
      />
    </div>
  );
}
