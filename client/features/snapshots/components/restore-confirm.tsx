import { Link } from 'react-router-dom';
import { Button, buttonClass } from '../../../components/button';
import { paths } from '../../../config/paths';
import { notices } from '../../../lib/notices';
import { useRestoreSnapshot } from '../api/restore-snapshot';
import type { SnapshotRow } from './snapshot-rows';

/** Asks once before a restore, and says what it does: one edit everyone in the room sees, undoable. */
export function RestoreConfirm({ roomId, row, onClose }: { roomId: string; row: SnapshotRow; onClose: () => void }) {
  const restore = useRestoreSnapshot(roomId, {
    onSuccess: (result) => {
      notices.post(
        result.changed
          ? {
              tone: 'success',
              title: 'Snapshot restored',
              message: `The room now holds “${row.label}”.${result.undoSnapshot ? ` The design before it is kept as “${result.undoSnapshot.label}”.` : ''}`,
            }
          : { tone: 'info', title: 'Nothing to restore', message: `The room already holds the design of “${row.label}”.` },
      );
      onClose();
    },
  });
  return (
    <div className="flex flex-col gap-3">
      <p>
        Restore <strong>“{row.label}”</strong>? The room’s design becomes this snapshot’s, as one edit that everyone in the room sees at
        once. The design just before is kept as a snapshot, so restoring that one undoes this.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button busy={restore.isPending} busyLabel="Restoring…" onClick={() => restore.mutate({ roomId, snapshotId: row.id })}>
          Restore “{row.label}”
        </Button>
        <Link to={paths.compare.getHref(roomId, row.id, 'live')} className={buttonClass('secondary')}>
          Compare with the room first
        </Link>
        <Button variant="quiet" onClick={onClose}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
