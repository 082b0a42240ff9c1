import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { groupMembershipUpdate, type GroupMembershipUpdate } from '@schema/workers';
import { FormActions } from '@frontend/components/form-actions';
import { TextField } from '@frontend/components/form-field';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { todayCalendarDate } from '@frontend/lib/format';
import { useUpdateGroupMembership } from '../api/update-group-membership';

const emptyToNull = (value: unknown) => (value === '' || value === undefined ? null : value);

/**
 * Change a membership's dates, or end it (`ending`: only the last day, today by default). The
 * server refuses dates that would leave one of the worker's valid results outside every period.
 */
export function MembershipDatesForm({
  organizationId,
  membership,
  ending,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  membership: { id: number; fromDate: string; toDate: string | null };
  ending: boolean;
  onSaved: () => void;
  onCancel: () => void;
}) {
  const update = useUpdateGroupMembership(organizationId);
  const form = useForm<z.input<typeof groupMembershipUpdate>, unknown, GroupMembershipUpdate>({
    resolver: zodResolver(groupMembershipUpdate),
    defaultValues: { fromDate: membership.fromDate, toDate: ending ? todayCalendarDate() : membership.toDate },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await update.mutateAsync({ membershipId: membership.id, changes: ending ? { toDate: values.toDate } : values });
      onSaved();
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['fromDate', 'toDate']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        {!ending && <TextField label="From" type="date" error={errors.fromDate?.message} {...form.register('fromDate')} />}
        <TextField
          label={ending ? 'Last day in the group' : 'To (optional)'}
          type="date"
          hint={ending ? undefined : 'Leave empty while still a member.'}
          error={errors.toDate?.message}
          {...form.register('toDate', { setValueAs: emptyToNull })}
        />
      </div>
      <FormActions error={formError} submitLabel={ending ? 'End membership' : 'Save dates'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
