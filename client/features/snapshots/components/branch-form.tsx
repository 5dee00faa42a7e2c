import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { Button, buttonClass } from '../../../components/button';
import { FormError, TextField } from '../../../components/form-field';
import { paths } from '../../../config/paths';
import { showServerErrors } from '../../../lib/form-errors';
import { branchInputSchema, useBranchSnapshot, type BranchInput } from '../api/branch-snapshot';
import type { SnapshotRow } from './snapshot-rows';

/**
 * Starts a new room from a snapshot. Afterwards it offers the new room and the comparison of the
 * branch (as it is now) with the snapshot it came from.
 */
export function BranchForm({ roomId, row, onClose }: { roomId: string; row: SnapshotRow; onClose: () => void }) {
  const [formError, setFormError] = useState<string | null>(null);
  const [created, setCreated] = useState<{ roomId: string; name: string } | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<BranchInput>({
    resolver: zodResolver(branchInputSchema),
    defaultValues: { name: `${row.label} — branch`, copyMembers: false },
  });
  const branch = useBranchSnapshot(roomId, {
    onSuccess: (result, input) => setCreated({ roomId: result.roomId, name: input.name.trim() }),
    onError: (error) => setFormError(showServerErrors(error, ['name', 'copyMembers'], setError)),
  });

  if (created)
    return (
      <div role="status" className="flex flex-col gap-3">
        <p>
          Branch <strong>“{created.name}”</strong> started from “{row.label}”. You own it.
        </p>
        <div className="flex flex-wrap gap-2">
          <Link to={paths.room.getHref(created.roomId)} className={buttonClass('primary', 'sm')}>
            Open the branch
          </Link>
          <Link to={paths.compare.getHref(created.roomId, row.id, 'live')} className={buttonClass('secondary', 'sm')}>
            Compare the branch with “{row.label}”
          </Link>
          <Button variant="quiet" size="sm" onClick={onClose}>
            Done
          </Button>
        </div>
      </div>
    );

  return (
    <form
      aria-label={`Branch from ${row.label}`}
      noValidate
      className="flex flex-col gap-3"
      onSubmit={handleSubmit((input) => {
        setFormError(null);
        branch.mutate({ snapshotId: row.id, ...input });
      })}
    >
      <p className="text-sm text-ink-soft">A branch is a new room seeded from this snapshot; this room stays as it is. You will own the branch.</p>
      <FormError message={formError} />
      <TextField label="Branch name" error={formState.errors.name?.message} {...register('name')} />
      <label className="flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" className="size-4 accent-teal-deep" {...register('copyMembers')} />
        Copy this room’s members, with their roles
      </label>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={branch.isPending} busyLabel="Creating the branch…">
          Create branch
        </Button>
        <Button variant="quiet" onClick={onClose}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
