import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { RoleBadge } from '../../../components/role-badge';
import { paths } from '../../../config/paths';
import type { RoomSummary } from '../api/room';
import { RoomNav } from './room-nav';

/** The room's name, the user's role in it, a way back to the room list, page-specific links and the room's tabs. */
export function RoomHeader({
  room,
  subtitle,
  actions,
}: {
  room: RoomSummary;
  subtitle?: string;
  actions?: ReactNode;
}) {
  return (
    <header className="mb-5 flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div className="min-w-0">
          <nav aria-label="Breadcrumb" className="mb-1 text-sm text-ink-faint">
            <Link to={paths.rooms.getHref()} className="hover:text-ink hover:underline">
              Rooms
            </Link>
            <span aria-hidden="true"> / </span>
            {subtitle ? (
              <Link to={paths.room.getHref(room.id)} className="hover:text-ink hover:underline">
                {room.name}
              </Link>
            ) : (
              <span aria-current="page">{room.name}</span>
            )}
          </nav>
          <div className="flex flex-wrap items-center gap-3">
            <h1 className="truncate text-2xl font-extrabold tracking-tight sm:text-3xl">
              {subtitle ?? room.name}
            </h1>
            <span className="flex items-center gap-1.5 text-sm text-ink-soft">
              <span>Your role</span>
              <RoleBadge role={room.role} />
            </span>
          </div>
        </div>
        {actions && <div className="flex flex-wrap items-center gap-2">{actions}</div>}
      </div>
      <RoomNav roomId={room.id} />
    </header>
  );
}
