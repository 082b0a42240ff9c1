import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { groupMembershipCreate, type GroupMembershipCreate } from '@schema/workers';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextField } from '@frontend/components/form-field';
import type { WorkerMembership } from '@frontend/lib/api-types';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { todayCalendarDate } from '@frontend/lib/format';
import { useCreateGroupMembership } from '../api/create-group-membership';

const idOrUndefined = (value: unknown) => (value === '' || value === undefined ? undefined : Number(value));
const emptyToNull = (value: unknown) => (value === '' || value === undefined ? null : value);

/**
 * Put a worker in a group from a date (to a date, or open-ended). On a group's page the group is
 * fixed and the worker is chosen; on a worker's page the other way round. Periods of the same
 * worker and group may not overlap: the server says which one clashes.
 */
export function MembershipForm({
  organizationId,
  fixed,
  choices,
  choiceLabel,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  fixed: { workerId: number } | { exposureGroupId: number };
  /** The workers (on a group's page) or groups (on a worker's page) to choose from. */
  choices: ReadonlyArray<{ id: number; label: string }>;
  choiceLabel: 'Worker' | 'Exposure group';
  onSaved: (membership: WorkerMembership) => void;
  onCancel: () => void;
}) {
  const create = useCreateGroupMembership(organizationId);
  const chosenField = 'workerId' in fixed ? 'exposureGroupId' : 'workerId';
  const form = useForm<z.input<typeof groupMembershipCreate>, unknown, GroupMembershipCreate>({
    resolver: zodResolver(groupMembershipCreate),
    defaultValues: { ...fixed, [chosenField]: choices[0]?.id, fromDate: todayCalendarDate(), toDate: null },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSaved(await create.mutateAsync(values));
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['workerId', 'exposureGroupId', 'fromDate', 'toDate']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <SelectField
        label={choiceLabel}
        options={choices.map((choice) => ({ value: String(choice.id), label: choice.label }))}
        error={errors[chosenField]?.message}
        {...form.register(chosenField, { setValueAs: idOrUndefined })}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="From" type="date" hint="First day in the group." error={errors.fromDate?.message} {...form.register('fromDate')} />
        <TextField
          label="To (optional)"
          type="date"
          hint="Last day; leave empty while still a member."
          error={errors.toDate?.message}
          {...form.register('toDate', { setValueAs: emptyToNull })}
        />
      </div>
      <FormActions error={formError} submitLabel="Add membership" pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
