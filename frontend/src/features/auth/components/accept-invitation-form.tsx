import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { invitationAccept } from '@schema/auth';
import { Button } from '@frontend/components/button';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { applyServerErrors } from '@frontend/lib/form-errors';
import { useAcceptInvitation } from '../api/accept-invitation';
import { newPasswordFields, passwordsMatch } from '../lib/confirm-password';
import type { SessionStart } from '../lib/start-session';

const acceptInvitationForm = invitationAccept.extend(newPasswordFields).refine(...passwordsMatch);

/** Name and password for an invited person; accepting signs them in. */
export function AcceptInvitationForm({ token, email, onAccepted }: { token: string; email: string; onAccepted: (session: SessionStart) => void }) {
  const form = useForm({ resolver: zodResolver(acceptInvitationForm), defaultValues: { name: '', password: '', confirmPassword: '' } });
  const mutation = useAcceptInvitation(token);
  const [formError, setFormError] = useState<string | null>(null);
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async ({ name, password }) => {
    setFormError(null);
    try {
      onAccepted(await mutation.mutateAsync({ name, password }));
    } catch (error) {
      setFormError(applyServerErrors(error, form.setError, ['name', 'password']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} className="space-y-4">
      <TextField label="E-mail" type="email" value={email} readOnly disabled autoComplete="username" />
      <TextField label="Your name" autoComplete="name" autoFocus error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. If you already use Bellwether with this e-mail, enter that password."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="Password, again"
        type="password"
        autoComplete="new-password"
        error={errors.confirmPassword?.message}
        {...form.register('confirmPassword')}
      />
      {formError && <Notice tone="error">{formError}</Notice>}
      <Button type="submit" variant="primary" pending={mutation.isPending} className="w-full">
        Accept and sign in
      </Button>
    </form>
  );
}
