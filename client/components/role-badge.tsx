import { roleDescriptions, type RoomRole } from '../lib/room-role';
import { cx } from '../lib/cx';

const tones: Record<RoomRole, string> = {
  owner: 'bg-violet-soft text-violet-deep border-violet/40',
  tuner: 'bg-teal-soft text-teal-deep border-teal/40',
  observer: 'bg-slate-soft text-ink-soft border-slate/40',
};

/** The user's role in a room, as a small labelled pill (colour is never the only cue: the word is there). */
export function RoleBadge({ role, className }: { role: RoomRole; className?: string }) {
  return (
    <span
      className={cx('inline-flex items-center rounded-full border px-2.5 py-0.5 text-xs font-bold tracking-wide uppercase', tones[role], className)}
      title={roleDescriptions[role]}
      data-role={role}
    >
      {role}
    </span>
  );
}
