import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/button';
import { FormError, TextField } from '../../../components/form-field';
import { showServerErrors } from '../../../lib/form-errors';
import { PASSWORD_MIN_LENGTH, signUpInputSchema, useSignUp, type SignUpInput } from '../api/sign-up';

/** `defaultEmail`: the address to start from (an invitation's). */
export function SignUpForm({ onSuccess, defaultEmail = '' }: { onSuccess: () => void; defaultEmail?: string }) {
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<SignUpInput>({
    resolver: zodResolver(signUpInputSchema),
    defaultValues: { displayName: '', email: defaultEmail, password: '' },
  });
  const signUp = useSignUp({
    onSuccess: () => onSuccess(),
    onError: (error) => setFormError(showServerErrors(error, ['displayName', 'email', 'password'], setError, { 'email-taken': 'email' })),
  });

  const submit = handleSubmit((input) => {
    setFormError(null);
    signUp.mutate(input);
  });

  return (
    <form onSubmit={submit} noValidate aria-label="Create an account" className="flex flex-col gap-4">
      <FormError message={formError} />
      <TextField label="Your name" autoComplete="name" error={formState.errors.displayName?.message} {...register('displayName')} />
      <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        error={formState.errors.password?.message}
        {...register('password')}
      />
      <Button type="submit" busy={signUp.isPending} busyLabel="Creating your account…">
        Create account
      </Button>
    </form>
  );
}
