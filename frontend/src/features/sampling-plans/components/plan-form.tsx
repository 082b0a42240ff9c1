import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { samplingPlanCreate, type SamplingPlanCreate } from '@schema/sampling-plans';
import { FormActions } from '@frontend/components/form-actions';
import { CheckboxField, TextAreaField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import type { PlanView, SamplingGuidance as Guidance } from '@frontend/lib/api-types';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { todayCalendarDate } from '@frontend/lib/format';
import { useCreateSamplingPlan } from '../api/create-sampling-plan';
import { useUpdateSamplingPlan } from '../api/update-sampling-plan';
import { SamplingGuidance } from './sampling-guidance';

const numberOrUndefined = (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value));

function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}

/**
 * Plan a group's sampling, or change a plan. The server draws the worker-shifts at random from
 * the seed (its own when left empty), among the group's members on each working day of the
 * window. Changing the target, the window or weekends draws again with the same seed.
 */
export function PlanForm({
  organizationId,
  groupId,
  plan,
  guidance,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  groupId: number;
  plan?: PlanView;
  guidance: Guidance;
  onSaved: (plan: PlanView) => void;
  onCancel: () => void;
}) {
  const create = useCreateSamplingPlan(organizationId);
  const update = useUpdateSamplingPlan(organizationId);
  const today = todayCalendarDate();
  const form = useForm<z.input<typeof samplingPlanCreate>, unknown, SamplingPlanCreate>({
    resolver: zodResolver(samplingPlanCreate),
    defaultValues: {
      title: plan?.title ?? '',
      targetCount: plan?.targetCount ?? guidance.defaultTargetCount,
      startDate: plan?.startDate ?? today,
      endDate: plan?.endDate ?? addDays(today, 55),
      includeWeekends: plan?.includeWeekends ?? false,
      seed: undefined,
      notes: plan?.notes ?? '',
    },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;
  const guidanceId = useId();

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      if (plan) {
        const { seed: _seed, ...changes } = values;
        onSaved(await update.mutateAsync({ planId: plan.id, changes }));
      } else {
        onSaved(await create.mutateAsync({ groupId, plan: values }));
      }
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['title', 'targetCount', 'startDate', 'endDate', 'includeWeekends', 'seed', 'notes']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <TextField label="Title (optional)" autoComplete="off" hint="E.g. “Autumn campaign”." error={errors.title?.message} {...form.register('title')} />
      <TextField
        label="Shifts to measure"
        type="number"
        min={1}
        max={200}
        className="max-w-40"
        aria-describedby={guidanceId}
        error={errors.targetCount?.message}
        {...form.register('targetCount', { setValueAs: numberOrUndefined })}
      />
      <SamplingGuidance guidance={guidance} id={guidanceId} />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="From" type="date" error={errors.startDate?.message} {...form.register('startDate')} />
        <TextField label="To" type="date" error={errors.endDate?.message} {...form.register('endDate')} />
      </div>
      <CheckboxField
        label="Include Saturdays and Sundays"
        hint="Leave off when the group works weekdays only."
        error={errors.includeWeekends?.message}
        {...form.register('includeWeekends')}
      />
      {!plan && (
        <TextField
          label="Seed (optional)"
          inputMode="numeric"
          className="max-w-56"
          hint="Leave empty for a new random seed. The same seed and settings always give the same picks."
          error={errors.seed?.message}
          {...form.register('seed', { setValueAs: numberOrUndefined })}
        />
      )}
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      {plan && <Notice tone="info">A new number of shifts, new dates or a change to weekends draws the picks again with the plan’s seed ({plan.seed}).</Notice>}
      <FormActions error={formError} submitLabel={plan ? 'Save plan' : 'Draw the plan'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
