import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/button';
import { FormError, SelectField, TextField } from '../../../components/form-field';
import { showServerErrors } from '../../../lib/form-errors';
import { notices } from '../../../lib/notices';
import { roleLabel, roleWithArticle, roomRoles } from '../../../lib/room-role';
import { addMemberInputSchema, useAddMember, type AddMemberInput } from '../api/add-member';

const roleOptions = roomRoles.map((role) => ({ value: role, label: roleLabel(role) }));

/** The owner's form: add someone by e-mail with a role (an address without an account is invited). */
export function AddMemberForm({ roomId }: { roomId: string }) {
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<AddMemberInput>({
    resolver: zodResolver(addMemberInputSchema),
    defaultValues: { email: '', role: 'tuner' },
  });
  const addMember = useAddMember(roomId, {
    onSuccess: (result, input) => {
      reset({ email: '', role: input.role });
      if (result.kind === 'added')
        notices.post({ tone: 'success', title: 'Member added', message: `${result.member.displayName} is now ${roleWithArticle(result.member.role)} of this room.` });
      else if (result.invitation.mailSent === false)
        notices.post({
          tone: 'error',
          title: 'Invitation recorded, not sent',
          message: `No account uses ${result.invitation.email} yet. The invitation to join as ${roleWithArticle(result.invitation.role)} is kept, but the mail server refused the message: add the address again to resend it.`,
        });
      else
        notices.post({
          tone: 'info',
          title: 'Invitation recorded',
          message: `No account uses ${result.invitation.email} yet; an invitation to join as ${roleWithArticle(result.invitation.role)} is kept for that address and was e-mailed to it, with a link that works once.`,
        });
    },
    onError: (error) => setFormError(showServerErrors(error, ['email', 'role'], setError, { 'already-member': 'email' })),
  });

  return (
    <form
      onSubmit={handleSubmit((input) => {
        setFormError(null);
        addMember.mutate({ roomId, ...input });
      })}
      noValidate
      aria-label="Add a member"
      className="flex flex-col gap-3"
    >
      <FormError message={formError} />
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField label="E-mail" type="email" autoComplete="off" className="flex-1" error={formState.errors.email?.message} {...register('email')} />
        <SelectField label="Role" options={roleOptions} className="sm:w-40" error={formState.errors.role?.message} {...register('role')} />
        <Button type="submit" busy={addMember.isPending} busyLabel="Adding…" className="sm:mt-6">
          Add member
        </Button>
      </div>
    </form>
  );
}
