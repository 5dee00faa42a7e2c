import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '../../../components/button';
import { FormError, TextField } from '../../../components/form-field';
import { showServerErrors } from '../../../lib/form-errors';
import { signInInputSchema, useSignIn, type SignInInput } from '../api/sign-in';
import { DemoAccounts } from './demo-accounts';

export interface SignInFormProps {
  onSuccess: () => void;
  /** Lists the demo accounts above the form (when the server says it holds them). */
  showDemoAccounts?: boolean;
}

export function SignInForm({ onSuccess, showDemoAccounts = false }: SignInFormProps) {
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, setValue, formState } = useForm<SignInInput>({
    resolver: zodResolver(signInInputSchema),
    defaultValues: { email: '', password: '' },
  });
  const signIn = useSignIn({
    onSuccess: () => onSuccess(),
    onError: (error) => setFormError(showServerErrors(error, ['email', 'password'], setError)),
  });

  const submit = handleSubmit((input) => {
    setFormError(null);
    signIn.mutate(input);
  });

  return (
    <div className="flex flex-col gap-5">
      {showDemoAccounts && (
        <DemoAccounts
          onPick={({ email, password }) => {
            setValue('email', email, { shouldValidate: true });
            setValue('password', password, { shouldValidate: true });
            setFormError(null);
          }}
        />
      )}
      <form onSubmit={submit} noValidate aria-label="Sign in" className="flex flex-col gap-4">
        <FormError message={formError} />
        <TextField label="E-mail" type="email" autoComplete="email" error={formState.errors.email?.message} {...register('email')} />
        <TextField
          label="Password"
          type="password"
          autoComplete="current-password"
          error={formState.errors.password?.message}
          {...register('password')}
        />
        <Button type="submit" busy={signIn.isPending} busyLabel="Signing in…">
          Sign in
        </Button>
      </form>
    </div>
  );
}
