/**
 * The lineage as an indented tree of our own drawing: a room, the snapshots taken in it (each with
 * its headline figures), and under a snapshot the rooms branched from it. Each room opens its
 * workspace; each snapshot opens its comparison with the room it belongs to, as that room is now.
 */
import { Link } from 'react-router-dom';
import type { Lineage } from '../../../../shared/api/lineage';
import { RoleBadge } from '../../../components/role-badge';
import { paths } from '../../../config/paths';
import { cx } from '../../../lib/cx';
import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import { snapshotRow } from '../../snapshots/components/snapshot-rows';
import { lineageCounts, lineageTree, type LineageRoomNode, type LineageSnapshotNode } from './lineage-model';

function Stamp({ time }: { time: number }) {
  const date = dateFrom(time);
  if (!date) return null;
  return (
    <time dateTime={date.toISOString()} title={dateTimeLabel(date)} className="text-xs text-ink-faint">
      {timeAgo(date)}
    </time>
  );
}

/** A small woven knot for a room, a dot on a thread for a snapshot: our own marks. */
function RoomMark({ current }: { current: boolean }) {
  return (
    <svg viewBox="0 0 16 16" width="16" height="16" aria-hidden="true" className="shrink-0">
      <rect x="1.5" y="1.5" width="13" height="13" rx="4" fill={current ? 'var(--color-amber-soft)' : 'var(--color-card)'} stroke="var(--color-ink)" strokeWidth="1.5" />
      <circle cx="9.5" cy="8" r="3" fill="none" stroke="var(--color-teal)" strokeWidth="2" />
    </svg>
  );
}

function SnapshotMark({ forReview }: { forReview: boolean }) {
  return (
    <svg viewBox="0 0 16 16" width="14" height="14" aria-hidden="true" className="shrink-0">
      <circle cx="8" cy="8" r="5" fill={forReview ? 'var(--color-amber)' : 'var(--color-paper)'} stroke="var(--color-amber-deep)" strokeWidth="1.8" />
    </svg>
  );
}

function SnapshotItem({ node }: { node: LineageSnapshotNode }) {
  const row = snapshotRow(node.snapshot);
  return (
    <li className="relative">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 py-1" data-lineage-snapshot={node.snapshot.id}>
        <SnapshotMark forReview={row.forReview} />
        <Link
          to={paths.compare.getHref(node.snapshot.roomId, node.snapshot.id, 'live')}
          className="font-semibold text-ink underline decoration-rule underline-offset-2 hover:decoration-ink"
          title={`Open “${row.label}” beside its room as it is now`}
        >
          {row.label}
        </Link>
        <span className="numeric text-xs text-ink-soft">
          VSWR {row.worstVswrText} · {row.bandwidthText} · {row.partCount ?? '—'} part{row.partCount === 1 ? '' : 's'}
        </span>
        {row.forReview && <span className="text-xs font-bold text-amber-deep">for review</span>}
        <span className="text-xs text-ink-faint">{row.who}</span>
        <Stamp time={row.createdAt} />
      </div>
      {node.branches.length > 0 && <Branches nodes={node.branches} />}
    </li>
  );
}

function RoomItem({ node }: { node: LineageRoomNode }) {
  const { room } = node;
  return (
    <li className="relative">
      <div className={cx('flex flex-wrap items-center gap-x-3 gap-y-1 rounded-lg py-1.5', node.current && 'bg-amber-soft/50 px-2 -mx-2')} data-lineage-room={room.id}>
        <RoomMark current={node.current} />
        {room.member ? (
          <>
            <Link to={paths.room.getHref(room.id)} className="font-extrabold text-ink hover:underline" aria-current={node.current ? 'page' : undefined}>
              {room.name}
            </Link>
            <RoleBadge role={room.role} />
            {node.current && <span className="text-xs font-bold text-amber-deep">this room</span>}
            <Stamp time={room.createdAt} />
          </>
        ) : (
          <span className="text-ink-soft italic">A branch you are not in</span>
        )}
        {node.orphan === 'parent-room-deleted' && <span className="text-xs text-ink-faint">(branched from a room that was deleted)</span>}
      </div>
      {(node.snapshots.length > 0 || node.looseBranches.length > 0) && (
        <ul className="ml-2 border-l-2 border-amber/40 pl-5">
          {node.snapshots.map((s) => (
            <SnapshotItem key={s.snapshot.id} node={s} />
          ))}
          {node.looseBranches.length > 0 && (
            <li>
              <p className="py-1 text-xs text-ink-faint">Branched from snapshots you cannot see:</p>
              <Branches nodes={node.looseBranches} />
            </li>
          )}
        </ul>
      )}
      {room.member && node.snapshots.length === 0 && <p className="ml-7 text-xs text-ink-faint">No snapshots yet.</p>}
    </li>
  );
}

function Branches({ nodes }: { nodes: LineageRoomNode[] }) {
  return (
    <ul className="ml-2 border-l-2 border-dashed border-violet/50 pl-5" aria-label="Branches">
      {nodes.map((n) => (
        <RoomItem key={n.room.id} node={n} />
      ))}
    </ul>
  );
}

export function LineageTree({ lineage }: { lineage: Lineage }) {
  const roots = lineageTree(lineage);
  const counts = lineageCounts(lineage);
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-soft">
        {counts.rooms} room{counts.rooms === 1 ? '' : 's'} and {counts.snapshots} snapshot{counts.snapshots === 1 ? '' : 's'}
        {counts.hidden > 0 ? `; ${counts.hidden} branch${counts.hidden === 1 ? '' : 'es'} you are not in` : ''}. A room opens its workspace; a
        snapshot opens beside its room as it is now.
      </p>
      <ul aria-label="Lineage" className="rounded-2xl border border-rule bg-card p-4 shadow-xs">
        {roots.map((n) => (
          <RoomItem key={n.room.id} node={n} />
        ))}
      </ul>
    </div>
  );
}
