import { zodResolver } from '@hookform/resolvers/zod';
import { useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { exposureUnitLabels, unitsForAgentKind, type AgentKind, type ExposureUnit } from '@schema/agents';
import { shiftResultCreate, type ShiftResultCreate } from '@schema/shift-results';
import { Button } from '@frontend/components/button';
import { CheckboxField, SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import type { ShiftResultView } from '@frontend/lib/api-types';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { todayCalendarDate } from '@frontend/lib/format';
import { useCreateShiftResult } from '../api/create-shift-result';
import { resultValueText } from './result-value';

type FormValues = z.input<typeof shiftResultCreate>;

const numberOrNull = (value: unknown) => (value === '' || value === null || value === undefined ? null : Number(String(value).replace(',', '.')));
const idOrUndefined = (value: unknown) => (value === '' || value === undefined ? undefined : Number(value));
const emptyToNull = (value: unknown) => (value === '' || value === undefined ? null : value);

const formFields = [
  'workerId',
  'date',
  'value',
  'unit',
  'nonDetect',
  'detectionLimit',
  'sampleId',
  'lab',
  'startTime',
  'endTime',
  'sampledMinutes',
  'notes',
] as const;

/**
 * Enter one shift result by hand: worker, date, value (or a non-detect with its detection
 * limit), unit, and the sample's details. Checked with the server's schema as you submit; the
 * server's own checks (a member on that date, not in the future, one valid result per
 * worker-shift) come back under the fields. "Save and add another" keeps worker, date and unit.
 */
export function ResultForm({
  organizationId,
  group,
  workers,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  group: { id: number; name: string; unit: ExposureUnit; agentKind: AgentKind };
  workers: ReadonlyArray<{ id: number; label: string }>;
  onSaved: (result: ShiftResultView, another: boolean) => void;
  onCancel: () => void;
}) {
  const create = useCreateShiftResult(organizationId);
  const blank = (keep?: Partial<FormValues>): FormValues => ({
    exposureGroupId: group.id,
    workerId: keep?.workerId ?? workers[0]?.id,
    date: keep?.date ?? todayCalendarDate(),
    value: null,
    unit: keep?.unit ?? group.unit,
    nonDetect: false,
    detectionLimit: null,
    sampleId: null,
    lab: keep?.lab ?? null,
    startTime: null,
    endTime: null,
    sampledMinutes: null,
    notes: '',
  });
  // Only one of value and detection limit is on screen: check (and send) only that one, so a
  // figure typed before ticking "non-detect" cannot block the form from a hidden field.
  const form = useForm<FormValues, unknown, ShiftResultCreate>({
    resolver: (values, context, options) =>
      zodResolver(shiftResultCreate)(values.nonDetect ? { ...values, value: null } : { ...values, detectionLimit: null }, context, options),
    defaultValues: blank(),
  });
  const [formError, setFormError] = useState<string | null>(null);
  const [lastSaved, setLastSaved] = useState<string | null>(null);
  const another = useRef(false);
  const { errors, isSubmitting } = form.formState;
  const nonDetect = form.watch('nonDetect');
  const unitOptions = unitsForAgentKind[group.agentKind].map((unit) => ({ value: unit, label: exposureUnitLabels[unit] }));

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    setLastSaved(null);
    try {
      const saved = await create.mutateAsync(values);
      onSaved(saved, another.current);
      if (another.current) {
        setLastSaved(`Saved ${saved.worker.code} on ${saved.date}: ${resultValueText(saved)}.`);
        form.reset(blank({ workerId: values.workerId, date: values.date, unit: values.unit, lab: values.lab }));
        form.setFocus('value');
      }
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, formFields));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      {lastSaved && <Notice tone="success">{lastSaved}</Notice>}
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Worker"
          options={workers.map((worker) => ({ value: String(worker.id), label: worker.label }))}
          error={errors.workerId?.message}
          {...form.register('workerId', { setValueAs: idOrUndefined })}
        />
        <TextField label="Shift date" type="date" error={errors.date?.message} {...form.register('date')} />
      </div>
      <CheckboxField
        label="Below the limit of detection (non-detect)"
        hint="The lab reported “< LOD”: give the detection limit instead of a value."
        {...form.register('nonDetect')}
      />
      <div className="grid gap-3 sm:grid-cols-2">
        {nonDetect ? (
          <TextField
            key="detectionLimit"
            label="Detection limit"
            inputMode="decimal"
            autoComplete="off"
            error={errors.detectionLimit?.message}
            {...form.register('detectionLimit', { setValueAs: numberOrNull })}
          />
        ) : (
          <TextField
            key="value"
            label="Shift result (TWA)"
            inputMode="decimal"
            autoComplete="off"
            hint="The full-shift value, as the lab or the instrument reports it."
            error={errors.value?.message}
            {...form.register('value', { setValueAs: numberOrNull })}
          />
        )}
        <SelectField
          label="Unit"
          options={unitOptions}
          hint={`Stored in ${exposureUnitLabels[group.unit]}, the group's OEL unit; other units are converted.`}
          error={errors.unit?.message}
          {...form.register('unit')}
        />
      </div>
      <fieldset className="space-y-3 rounded border border-slate-200 px-3 pt-1 pb-3">
        <legend className="px-1 text-sm font-medium text-slate-700">Sample details (optional)</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField label="Sample id" autoComplete="off" error={errors.sampleId?.message} {...form.register('sampleId', { setValueAs: emptyToNull })} />
          <TextField label="Lab" autoComplete="off" error={errors.lab?.message} {...form.register('lab', { setValueAs: emptyToNull })} />
        </div>
        <div className="grid gap-3 sm:grid-cols-3">
          <TextField label="Start time" type="time" error={errors.startTime?.message} {...form.register('startTime', { setValueAs: emptyToNull })} />
          <TextField label="End time" type="time" error={errors.endTime?.message} {...form.register('endTime', { setValueAs: emptyToNull })} />
          <TextField
            label="Minutes sampled"
            inputMode="decimal"
            error={errors.sampledMinutes?.message}
            {...form.register('sampledMinutes', { setValueAs: numberOrNull })}
          />
        </div>
      </fieldset>
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      {formError && <Notice tone="error">{formError}</Notice>}
      <div className="flex flex-wrap justify-end gap-2">
        <Button onClick={onCancel}>Cancel</Button>
        {/* Not a submit button: Enter in a field submits with the default, "Save result". */}
        <Button
          pending={isSubmitting && another.current}
          onClick={() => {
            another.current = true;
            void submit();
          }}
        >
          Save and add another
        </Button>
        <Button type="submit" variant="primary" pending={isSubmitting && !another.current} onClick={() => (another.current = false)}>
          Save result
        </Button>
      </div>
    </form>
  );
}
