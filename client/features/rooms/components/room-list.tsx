import { Link } from 'react-router-dom';
import { RoleBadge } from '../../../components/role-badge';
import { paths } from '../../../config/paths';
import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import type { RoomParent, RoomSummary } from '../api/room';

/** A stem forking in two: our mark for "started from a snapshot of another room". */
function BranchIcon() {
  return (
    <svg viewBox="0 0 16 16" width="14" height="14" aria-hidden="true" focusable="false" className="mr-1.5 inline-block align-[-2px] text-violet">
      <path d="M4 2v12M4 9c0-3 8-2 8-6" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
      <circle cx="12" cy="3" r="1.6" fill="currentColor" />
      <circle cx="4" cy="14" r="1.6" fill="currentColor" />
    </svg>
  );
}

function BranchInfo({ parent }: { parent: RoomParent }) {
  const from = parent.snapshotLabel ? `snapshot “${parent.snapshotLabel}”` : 'a snapshot';
  return (
    <p className="text-sm text-ink-soft">
      <BranchIcon />
      Branch of {from}
      {parent.roomName && (
        <>
          {' '}in{' '}
          {parent.roomId ? (
            <Link to={paths.room.getHref(parent.roomId)} className="font-semibold text-ink underline decoration-rule underline-offset-2 hover:decoration-ink">
              {parent.roomName}
            </Link>
          ) : (
            <span className="font-semibold">{parent.roomName}</span>
          )}
        </>
      )}
    </p>
  );
}

function Updated({ time }: { time: RoomSummary['updatedAt'] }) {
  const date = dateFrom(time);
  if (!date) return null;
  return (
    <p className="text-sm text-ink-faint">
      Updated{' '}
      <time dateTime={date.toISOString()} title={dateTimeLabel(date)}>
        {timeAgo(date)}
      </time>
    </p>
  );
}

/** The rooms the user belongs to, each with the user's role, when it last changed and where it branched from. */
export function RoomList({ rooms }: { rooms: readonly RoomSummary[] }) {
  if (!rooms.length)
    return (
      <p className="rounded-xl border border-dashed border-rule bg-card px-4 py-6 text-ink-soft">
        You are not in any room yet. Start one above, or ask a room’s owner to add you.
      </p>
    );
  return (
    <ul aria-label="Your rooms" className="grid gap-3 sm:grid-cols-2">
      {rooms.map((room) => (
        <li key={room.id} className="group relative flex flex-col gap-1.5 rounded-xl border border-rule bg-card p-4 shadow-xs transition hover:border-ink-faint hover:shadow-sm">
          <div className="flex items-start justify-between gap-3">
            <h3 className="text-lg leading-snug font-bold">
              <Link to={paths.room.getHref(room.id)} className="rounded-sm hover:underline">
                {room.name}
              </Link>
            </h3>
            <RoleBadge role={room.role} className="mt-0.5 shrink-0" />
          </div>
          {room.parent && <BranchInfo parent={room.parent} />}
          <Updated time={room.updatedAt} />
        </li>
      ))}
    </ul>
  );
}
