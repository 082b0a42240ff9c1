import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { workerCreate, type WorkerCreate } from '@schema/workers';
import { FormActions } from '@frontend/components/form-actions';
import { TextField } from '@frontend/components/form-field';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { useCreateWorker } from '../api/create-worker';
import type { WorkerDetail } from '../api/get-worker';
import type { WorkerPublic } from '../api/get-workers';
import { useUpdateWorker } from '../api/update-worker';

/**
 * Add or edit a worker: the code results refer to, an optional name, the job title and an optional
 * e-mail address for worker letters. Roles that may not see names (consultants) never get this
 * form; the name and e-mail fields are left out for them too.
 */
export function WorkerForm({
  organizationId,
  worker,
  canSeeNames,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  worker?: WorkerPublic;
  canSeeNames: boolean;
  onSaved: (worker: WorkerDetail) => void;
  onCancel: () => void;
}) {
  const create = useCreateWorker(organizationId);
  const update = useUpdateWorker(organizationId);
  const form = useForm<z.input<typeof workerCreate>, unknown, WorkerCreate>({
    resolver: zodResolver(workerCreate),
    defaultValues: { code: worker?.code ?? '', name: worker?.name ?? '', jobTitle: worker?.jobTitle ?? '', email: worker?.email ?? '' },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSaved(
        worker
          ? // Without the name and e-mail fields, leave the stored ones as they are.
            await update.mutateAsync({ workerId: worker.id, changes: canSeeNames ? values : { code: values.code, jobTitle: values.jobTitle } })
          : await create.mutateAsync(canSeeNames ? values : { ...values, name: null, email: null }),
      );
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['code', 'name', 'jobTitle', 'email']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <TextField
        label="Worker code"
        autoComplete="off"
        hint="What lab files and noise logs use, e.g. RT-017. Letters, digits, dots, hyphens, underscores."
        error={errors.code?.message}
        {...form.register('code')}
      />
      {canSeeNames && (
        <TextField
          label="Name (optional)"
          autoComplete="off"
          hint="Personal data: shown only to roles that may see names, never to consultants."
          error={errors.name?.message}
          {...form.register('name')}
        />
      )}
      <TextField label="Job title" autoComplete="off" error={errors.jobTitle?.message} {...form.register('jobTitle')} />
      {canSeeNames && (
        <TextField
          label="E-mail address (optional)"
          type="email"
          autoComplete="off"
          hint="Where letters about the worker's results are e-mailed. Personal data, like the name."
          error={errors.email?.message}
          {...form.register('email')}
        />
      )}
      <FormActions error={formError} submitLabel={worker ? 'Save worker' : 'Add worker'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
