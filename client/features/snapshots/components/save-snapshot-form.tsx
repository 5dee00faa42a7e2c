import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/button';
import { FormError, TextField } from '../../../components/form-field';
import { showServerErrors } from '../../../lib/form-errors';
import { notices } from '../../../lib/notices';
import { createSnapshotInputSchema, useCreateSnapshot, type CreateSnapshotInput } from '../api/create-snapshot';

/** An owner's or tuner's form: keep the room's design now as a named snapshot, optionally for review. */
export function SaveSnapshotForm({ roomId }: { roomId: string }) {
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<CreateSnapshotInput>({
    resolver: zodResolver(createSnapshotInputSchema),
    defaultValues: { label: '', forReview: false },
  });
  const create = useCreateSnapshot(roomId, {
    onSuccess: (snapshot) => {
      reset({ label: '', forReview: false });
      notices.post({
        tone: 'success',
        title: 'Snapshot saved',
        message: `“${snapshot.label}” keeps the room’s design as it is now${snapshot.forReview ? ', marked for review' : ''}.`,
      });
    },
    onError: (error) => setFormError(showServerErrors(error, ['label', 'forReview'], setError)),
  });
  return (
    <form
      aria-label="Save a snapshot"
      noValidate
      className="flex flex-col gap-3"
      onSubmit={handleSubmit((input) => {
        setFormError(null);
        create.mutate({ roomId, ...input });
      })}
    >
      <FormError message={formError} />
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField label="Snapshot label" placeholder="e.g. E12 values, before the new measurement" className="flex-1" error={formState.errors.label?.message} {...register('label')} />
        <label className="flex items-center gap-2 text-sm font-semibold sm:mt-8">
          <input type="checkbox" className="size-4 accent-amber-deep" {...register('forReview')} />
          For review
        </label>
        <Button type="submit" busy={create.isPending} busyLabel="Saving…" className="sm:mt-6">
          Save snapshot
        </Button>
      </div>
    </form>
  );
}
