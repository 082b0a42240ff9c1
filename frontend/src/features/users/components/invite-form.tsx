import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { invitationCreate } from '@schema/auth';
import { roleLabels, roles } from '@schema/permissions';
import { Button } from '@frontend/components/button';
import { SelectField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { applyServerErrors } from '@frontend/lib/form-errors';
import { useCreateInvitation } from '../api/create-invitation';

const roleOptions = roles.map((role) => ({ value: role, label: roleLabels[role] }));

/** Invite someone by e-mail with a role; the server sends the single-use link. */
export function InviteForm({ organizationId }: { organizationId: string }) {
  const form = useForm({ resolver: zodResolver(invitationCreate), defaultValues: { email: '', role: 'hygienist' as const } });
  const mutation = useCreateInvitation(organizationId);
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    setSentTo(null);
    try {
      await mutation.mutateAsync(values);
      setSentTo(values.email);
      form.reset({ email: '', role: values.role });
    } catch (error) {
      setFormError(applyServerErrors(error, form.setError, ['email', 'role']));
    }
  });

  return (
    <form noValidate onSubmit={onSubmit} aria-labelledby="invite-title" className="space-y-3">
      <h2 id="invite-title" className="text-base">
        Invite someone
      </h2>
      <div className="flex flex-wrap items-start gap-3">
        <TextField label="E-mail" type="email" autoComplete="off" className="min-w-60 flex-1" error={errors.email?.message} {...form.register('email')} />
        <SelectField label="Role" options={roleOptions} className="w-44" error={errors.role?.message} {...form.register('role')} />
        <Button type="submit" variant="primary" pending={mutation.isPending} className="mt-6">
          Send invitation
        </Button>
      </div>
      {formError && <Notice tone="error">{formError}</Notice>}
      {sentTo && (
        <Notice tone="success">
          Invitation sent to <strong>{sentTo}</strong>. The link works once, for 7 days.
        </Notice>
      )}
    </form>
  );
}
