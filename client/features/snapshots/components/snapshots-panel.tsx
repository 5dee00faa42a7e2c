/**
 * FOR THE WORKSPACE: `<SnapshotsPanel roomId role />` — the room's snapshots, live. Owners and tuners
 * save snapshots (optionally for review), restore one (one edit everyone sees; the state before is
 * kept), branch from one and flag it for review; everyone may open comparisons. Observers get the
 * table read-only. `compact` drops the comparison menus (for a narrow side panel).
 */
import { useCallback, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/button';
import { Loading } from '../../../components/page-status';
import { paths } from '../../../config/paths';
import type { RoomRole } from '../../../lib/room-role';
import { livePollInterval, useRoomLiveData } from '../../../lib/use-room-live-data';
import { useSnapshots } from '../api/get-snapshots';
import { useUpdateSnapshot } from '../api/update-snapshot';
import { BranchForm } from './branch-form';
import { ComparePicker } from './compare-picker';
import { RestoreConfirm } from './restore-confirm';
import { SaveSnapshotForm } from './save-snapshot-form';
import type { SnapshotRow } from './snapshot-rows';
import { SnapshotTable } from './snapshot-table';

export interface SnapshotsPanelProps {
  roomId: string;
  role: RoomRole;
  compact?: boolean;
  /** Rows per page of the table. */
  pageSize?: number;
}

type Pending = { kind: 'restore' | 'branch'; row: SnapshotRow } | null;

const linkClass = 'font-semibold text-teal-deep underline decoration-teal/40 underline-offset-2 hover:decoration-teal-deep';

function Card({ title, children, id }: { title: string; children: ReactNode; id: string }) {
  return (
    <section aria-labelledby={id} className="rounded-2xl border border-rule bg-card p-4 shadow-xs">
      <h3 id={id} className="mb-3 text-base font-extrabold">
        {title}
      </h3>
      {children}
    </section>
  );
}

export function SnapshotsPanel({ roomId, role, compact = false, pageSize }: SnapshotsPanelProps) {
  const canEdit = role === 'owner' || role === 'tuner';
  const status = useRoomLiveData(roomId);
  const snapshots = useSnapshots(roomId, { refetchInterval: livePollInterval(status) });
  const [pending, setPending] = useState<Pending>(null);
  const flag = useUpdateSnapshot(roomId);

  const renderActions = useCallback(
    (row: SnapshotRow) => (
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 whitespace-nowrap">
        <Link to={paths.compare.getHref(roomId, row.id, 'live')} className={linkClass} aria-label={`Compare ${row.label} with the room now`}>
          Compare with live
        </Link>
        {canEdit && (
          <>
            <Button variant="secondary" size="sm" aria-label={`Restore ${row.label}`} onClick={() => setPending({ kind: 'restore', row })}>
              Restore
            </Button>
            <Button variant="secondary" size="sm" aria-label={`Branch from ${row.label}`} onClick={() => setPending({ kind: 'branch', row })}>
              Branch
            </Button>
            <Button
              variant="quiet"
              size="sm"
              aria-label={row.forReview ? `Clear the review flag of ${row.label}` : `Mark ${row.label} for review`}
              aria-pressed={row.forReview}
              disabled={flag.isPending}
              onClick={() => flag.mutate({ snapshotId: row.id, forReview: !row.forReview })}
            >
              {row.forReview ? 'Clear review' : 'For review'}
            </Button>
          </>
        )}
      </div>
    ),
    [roomId, canEdit, flag],
  );

  return (
    <div className="flex flex-col gap-4" data-testid="snapshots-panel">
      {canEdit ? (
        <Card title="Save a snapshot" id={`${roomId}-save-snapshot`}>
          <SaveSnapshotForm roomId={roomId} />
        </Card>
      ) : (
        <p className="rounded-xl border border-rule bg-paper-deep/60 px-4 py-3 text-sm text-ink-soft">
          Owners and tuners save, restore and branch snapshots; you can read them and open comparisons.
        </p>
      )}

      {pending && (
        <section aria-label={pending.kind === 'restore' ? 'Restore a snapshot' : 'Branch from a snapshot'} className="rounded-2xl border-2 border-amber/60 bg-amber-soft/40 p-4">
          {pending.kind === 'restore' ? (
            <RestoreConfirm roomId={roomId} row={pending.row} onClose={() => setPending(null)} />
          ) : (
            <BranchForm key={pending.row.id} roomId={roomId} row={pending.row} onClose={() => setPending(null)} />
          )}
        </section>
      )}

      {snapshots.data ? (
        <>
          <SnapshotTable snapshots={snapshots.data} renderActions={renderActions} pageSize={pageSize} caption="The room’s snapshots" />
          {!compact && snapshots.data.length > 0 && (
            <Card title="Compare" id={`${roomId}-compare-snapshots`}>
              <ComparePicker roomId={roomId} snapshots={snapshots.data} />
            </Card>
          )}
        </>
      ) : snapshots.isError ? (
        <p role="alert" className="text-coral-deep">
          {snapshots.error.message}
        </p>
      ) : (
        <Loading label="Loading the snapshots…" />
      )}
    </div>
  );
}
