import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/button';
import { FormError, TextField } from '../../../components/form-field';
import { showServerErrors } from '../../../lib/form-errors';
import { createRoomInputSchema, useCreateRoom, type CreateRoomInput } from '../api/create-room';

/** Names and creates a new room; the creator becomes its owner. */
export function CreateRoomForm({ onCreated }: { onCreated: (roomId: string) => void }) {
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<CreateRoomInput>({
    resolver: zodResolver(createRoomInputSchema),
    defaultValues: { name: '' },
  });
  const createRoom = useCreateRoom({
    onSuccess: (room) => {
      reset();
      onCreated(room.id);
    },
    onError: (error) => setFormError(showServerErrors(error, ['name'], setError)),
  });

  return (
    <form
      onSubmit={handleSubmit((input) => {
        setFormError(null);
        createRoom.mutate(input);
      })}
      noValidate
      aria-label="Create a room"
      className="flex flex-col gap-3"
    >
      <FormError message={formError} />
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField
          label="Room name"
          placeholder="e.g. 868 MHz PCB antenna, rev B"
          className="flex-1"
          error={formState.errors.name?.message}
          {...register('name')}
        />
        <Button type="submit" busy={createRoom.isPending} busyLabel="Creating…" className="sm:mt-6">
          Create room
        </Button>
      </div>
    </form>
  );
}
