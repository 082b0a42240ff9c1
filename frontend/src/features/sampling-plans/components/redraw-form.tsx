import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { samplingPlanRedraw, type SamplingPlanRedraw } from '@schema/sampling-plans';
import { FormActions } from '@frontend/components/form-actions';
import { TextAreaField, TextField } from '@frontend/components/form-field';
import type { PlanView } from '@frontend/lib/api-types';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { useRedrawSamplingPlan } from '../api/update-sampling-plan';

const numberOrUndefined = (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value));
const emptyToUndefined = (value: unknown) => (value === '' ? undefined : value);

/** New picks from a new seed; the old draw is kept, and the reason goes to the audit trail. */
export function RedrawForm({
  organizationId,
  plan,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  plan: PlanView;
  onSaved: (plan: PlanView) => void;
  onCancel: () => void;
}) {
  const redraw = useRedrawSamplingPlan(organizationId);
  const form = useForm<z.input<typeof samplingPlanRedraw>, unknown, SamplingPlanRedraw>({
    resolver: zodResolver(samplingPlanRedraw),
    defaultValues: { seed: undefined, reason: '' },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSaved(await redraw.mutateAsync({ planId: plan.id, redraw: values }));
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['seed', 'reason']));
    }
  });
  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <TextAreaField
        label="Reason"
        rows={2}
        hint="Why the picks change, e.g. “two picked workers on leave”. Kept in the audit trail."
        error={errors.reason?.message}
        {...form.register('reason', { setValueAs: emptyToUndefined })}
      />
      <TextField
        label="New seed (optional)"
        inputMode="numeric"
        className="max-w-56"
        hint={`Leave empty for a new random seed; the current one is ${plan.seed}.`}
        error={errors.seed?.message}
        {...form.register('seed', { setValueAs: numberOrUndefined })}
      />
      <FormActions error={formError} submitLabel="Redraw" pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
