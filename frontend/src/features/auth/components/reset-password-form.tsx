import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Link } from 'react-router';
import { Button } from '@frontend/components/button';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { applyServerErrors } from '@frontend/lib/form-errors';
import { useResetPassword } from '../api/reset-password';
import { newPasswordFields, passwordsMatch } from '../lib/confirm-password';

const resetPasswordForm = z.object(newPasswordFields).refine(...passwordsMatch);

/** A new password for the account the link belongs to. */
export function ResetPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const form = useForm({ resolver: zodResolver(resetPasswordForm), defaultValues: { password: '', confirmPassword: '' } });
  const mutation = useResetPassword();
  const [formError, setFormError] = useState<string | null>(null);
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async ({ password }) => {
    setFormError(null);
    try {
      await mutation.mutateAsync({ token, password });
      onDone();
    } catch (error) {
      setFormError(applyServerErrors(error, form.setError, ['password']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="space-y-4">
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        autoFocus
        hint="At least 10 characters."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="New password, again"
        type="password"
        autoComplete="new-password"
        error={errors.confirmPassword?.message}
        {...form.register('confirmPassword')}
      />
      {formError && (
        <Notice tone="error">
          {formError} <Link to="/forgot-password">Ask for a new link</Link>.
        </Notice>
      )}
      <Button type="submit" variant="primary" pending={mutation.isPending} className="w-full">
        Save the new password
      </Button>
    </form>
  );
}
