import { Link, useParams, useSearchParams } from 'react-router-dom';
import { LIVE_REF } from '../../../shared/api/compare';
import { buttonClass } from '../../components/button';
import { Loading } from '../../components/page-status';
import { paths } from '../../config/paths';
import { CompareView } from '../../features/compare/components/compare-view';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { useSnapshots } from '../../features/snapshots/api/get-snapshots';
import { ComparePicker } from '../../features/snapshots/components/compare-picker';
import { useRoomLiveData } from '../../lib/use-room-live-data';
import { roomLoader } from '../room-loader';
import type { RouteHandle } from '../router';

export const clientLoader = roomLoader;

/** Two charts side by side want the width. */
export const handle: RouteHandle = { wide: true };

export default function CompareRoute() {
  const roomId = useParams().roomId ?? '';
  const [search] = useSearchParams();
  const a = search.get('a') ?? '';
  const b = search.get('b') ?? LIVE_REF;
  const { data: room } = useRoom(roomId);
  const snapshots = useSnapshots(roomId);
  useRoomLiveData(roomId);
  if (!room) return <Loading />;
  return (
    <div className="mx-auto flex w-full max-w-7xl flex-col">
      <RoomHeader
        room={room}
        subtitle="Compare"
        actions={
          <Link to={paths.snapshots.getHref(room.id)} className={buttonClass('secondary', 'sm')}>
            All snapshots
          </Link>
        }
      />
      {a ? (
        <CompareView key={`${a}|${b}`} roomId={room.id} a={a} b={b} />
      ) : (
        <p className="rounded-xl border border-rule bg-card px-4 py-3 text-ink-soft">Choose the two designs to compare below.</p>
      )}
      {snapshots.data && snapshots.data.length > 0 && (
        <section aria-label="Compare others" className="mt-6 rounded-2xl border border-rule bg-card p-4 shadow-xs">
          <ComparePicker roomId={room.id} snapshots={snapshots.data} />
        </section>
      )}
    </div>
  );
}
