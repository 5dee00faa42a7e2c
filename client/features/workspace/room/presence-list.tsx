/** Presence: avatars in the toolbar, and the list in the room tab with follow buttons. */
import { RoleBadge } from '../../../components/role-badge';
import { initials } from '../collab/presence-state';
import { smallButton } from '../inspector/small-button';
import type { PresenceRow } from './presence-rows';

export function Avatar({ row, size = 28 }: { row: Pick<PresenceRow, 'name' | 'colour' | 'role'>; size?: number }) {
  return (
    <span
      className="inline-flex shrink-0 items-center justify-center rounded-full font-bold text-white ring-2 ring-card"
      style={{ width: size, height: size, background: row.colour, fontSize: size * 0.4 }}
      aria-hidden="true"
    >
      {initials(row.name)}
    </span>
  );
}

export function PresenceAvatars({ rows }: { rows: readonly PresenceRow[] }) {
  const shown = rows.slice(0, 6);
  return (
    <ul className="flex items-center -space-x-1.5" aria-label={`In the room: ${rows.map((r) => `${r.name} (${r.role})`).join(', ')}`}>
      {shown.map((r) => (
        <li key={r.userId} title={`${r.name}${r.isMe ? ' (you)' : ''}, ${r.role}`}>
          <Avatar row={r} />
        </li>
      ))}
      {rows.length > shown.length && <li className="pl-2 text-xs text-ink-soft">+{rows.length - shown.length}</li>}
    </ul>
  );
}

export interface PresenceListProps {
  rows: readonly PresenceRow[];
  followingId: string | null;
  onFollow(userId: string | null): void;
  elementName(id: string): string;
}

export function PresenceList({ rows, followingId, onFollow, elementName }: PresenceListProps) {
  const nameOf = (id: string | null) => rows.find((r) => r.userId === id)?.name ?? 'someone';
  return (
    <ul className="flex flex-col gap-1.5" aria-label="People in the room" data-testid="presence-list">
      {rows.map((r) => (
        <li key={r.userId} className="flex items-center gap-2 rounded-md bg-card px-2 py-1.5">
          <Avatar row={r} />
          <div className="min-w-0 flex-1">
            <p className="truncate text-sm font-semibold text-ink">
              {r.name}
              {r.isMe && <span className="font-normal text-ink-faint"> (you)</span>}
            </p>
            <p className="truncate text-[11px] text-ink-soft">
              {r.selections.length ? `on ${r.selections.map(elementName).join(', ')}` : 'no element selected'}
              {r.following && ` · following ${nameOf(r.following)}`}
            </p>
          </div>
          <RoleBadge role={r.role} className="!px-1.5 !text-[10px]" />
          {!r.isMe &&
            (followingId === r.userId ? (
              <button type="button" className={smallButton('primary')} aria-pressed="true" onClick={() => onFollow(null)}>
                Following
              </button>
            ) : (
              <button type="button" className={smallButton()} aria-pressed="false" onClick={() => onFollow(r.userId)} aria-label={`Follow ${r.name}`}>
                Follow
              </button>
            ))}
        </li>
      ))}
    </ul>
  );
}
