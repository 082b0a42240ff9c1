import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router';
import { signIn } from '@schema/auth';
import { Button } from '@frontend/components/button';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { applyServerErrors } from '@frontend/lib/form-errors';
import { useSignIn } from '../api/sign-in';
import type { SessionStart } from '../lib/start-session';

/** E-mail and password. A wrong pair or too many tries shows the server's message above the button. */
export function SignInForm({ onSignedIn }: { onSignedIn: (session: SessionStart) => void }) {
  const form = useForm({ resolver: zodResolver(signIn), defaultValues: { email: '', password: '' } });
  const mutation = useSignIn();
  const [formError, setFormError] = useState<string | null>(null);
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSignedIn(await mutation.mutateAsync(values));
    } catch (error) {
      setFormError(applyServerErrors(error, form.setError, ['email', 'password']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="space-y-4" aria-labelledby="sign-in-title">
      <TextField label="E-mail" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      {formError && <Notice tone="error">{formError}</Notice>}
      <div className="flex items-center justify-between gap-3">
        <Link to="/forgot-password" className="text-sm">
          Forgot your password?
        </Link>
        <Button type="submit" variant="primary" pending={mutation.isPending}>
          Sign in
        </Button>
      </div>
    </form>
  );
}
