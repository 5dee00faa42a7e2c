/** The room log: the room's running history of changes, newest first. */
import type { RoomLogEntry } from '../../../../shared/collab/events';
import { presenceColour } from '../../../../shared/collab/presence';
import { timeAgo } from '../../../lib/format-time';

export function RoomLog({ entries, now = new Date() }: { entries: readonly RoomLogEntry[]; now?: Date }) {
  if (entries.length === 0) return <p className="text-xs text-ink-faint">No changes yet in this session.</p>;
  return (
    <ol className="flex flex-col gap-1" aria-label="Room log, newest first" data-testid="room-log">
      {entries.map((e) => (
        <li key={e.id} className="flex gap-2 text-xs leading-snug">
          <span className="mt-1 size-2 shrink-0 rounded-full" style={{ background: e.userId ? presenceColour(e.userId) : '#6c7791' }} aria-hidden="true" />
          <span className="min-w-0 flex-1 text-ink">
            <LogMessage entry={e} />
          </span>
          <time className="shrink-0 text-[11px] text-ink-faint" dateTime={new Date(e.at).toISOString()}>
            {timeAgo(new Date(e.at), now)}
          </time>
        </li>
      ))}
    </ol>
  );
}

/** The server's sentence starts with the person's name; that part is set in bold. */
function LogMessage({ entry }: { entry: RoomLogEntry }) {
  const name = entry.displayName;
  if (name && entry.message.startsWith(`${name} `))
    return (
      <>
        <strong className="font-semibold">{name}</strong>
        {entry.message.slice(name.length)}
      </>
    );
  return <>{entry.message}</>;
}
