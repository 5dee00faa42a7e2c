import { NavLink } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { cx } from '../../../lib/cx';

/** The pages of a room, in the order an engineer reaches for them. */
export const roomPages = (roomId: string) =>
  [
    { label: 'Workspace', href: paths.room.getHref(roomId), end: true },
    { label: 'Snapshots', href: paths.snapshots.getHref(roomId), end: false },
    { label: 'Lineage', href: paths.lineage.getHref(roomId), end: false },
    { label: 'Notes', href: paths.notes.getHref(roomId), end: false },
    { label: 'Uploads', href: paths.uploads.getHref(roomId), end: false },
    { label: 'Hand-off', href: paths.handoff.getHref(roomId), end: false },
    { label: 'Members', href: paths.members.getHref(roomId), end: false },
  ] as const;

/** The room's tabs: a row of links, the current page marked (`aria-current="page"`), scrolling sideways on a phone. */
export function RoomNav({ roomId }: { roomId: string }) {
  return (
    <nav aria-label="Room pages" className="-mx-1 overflow-x-auto">
      <ul className="flex min-w-max gap-1 border-b border-rule px-1">
        {roomPages(roomId).map((page) => (
          <li key={page.label}>
            <NavLink
              to={page.href}
              end={page.end}
              className={({ isActive }) =>
                cx(
                  '-mb-px inline-block rounded-t-lg border-b-3 px-3 py-1.5 text-sm font-semibold transition-colors',
                  isActive ? 'border-amber text-ink' : 'border-transparent text-ink-soft hover:border-rule hover:text-ink',
                )
              }
            >
              {page.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
