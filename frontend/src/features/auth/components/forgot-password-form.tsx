import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { forgotPassword } from '@schema/auth';
import { Button } from '@frontend/components/button';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { applyServerErrors } from '@frontend/lib/form-errors';
import { useForgotPassword } from '../api/forgot-password';

/**
 * Asks for a reset link. The answer is the same whether or not the address has an account,
 * so the page never tells a stranger who uses Bellwether.
 */
export function ForgotPasswordForm() {
  const form = useForm({ resolver: zodResolver(forgotPassword), defaultValues: { email: '' } });
  const mutation = useForgotPassword();
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await mutation.mutateAsync(values);
      setSentTo(values.email);
    } catch (error) {
      setFormError(applyServerErrors(error, form.setError, ['email']));
    }
  });

  if (sentTo) {
    return (
      <Notice tone="success" title="Check your e-mail">
        If an account uses <strong>{sentTo}</strong>, a link to choose a new password is on its way. The link works once.
      </Notice>
    );
  }

  return (
    <form noValidate onSubmit={onSubmit} className="space-y-4">
      <TextField
        label="E-mail"
        type="email"
        autoComplete="email"
        autoFocus
        hint="We send a link to choose a new password to this address."
        error={form.formState.errors.email?.message}
        {...form.register('email')}
      />
      {formError && <Notice tone="error">{formError}</Notice>}
      <Button type="submit" variant="primary" pending={mutation.isPending} className="w-full">
        Send the link
      </Button>
    </form>
  );
}
