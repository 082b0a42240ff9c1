import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useFieldArray, useForm, type Control, type FieldErrors, type Path, type Resolver, type UseFormRegister } from 'react-hook-form';
import {
  noiseEstimateInput,
  noiseInstrumentLabels,
  noiseInstruments,
  noiseStrategies,
  noiseStrategyLabels,
  type NoiseEstimateInput,
  type NoiseEstimateParsed,
  type NoiseEstimateView,
} from '@schema/noise-estimates';
import { Button } from '@frontend/components/button';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { isApiError } from '@frontend/lib/api-client';
import { useNoiseLogDays } from '../api/get-noise-log-days';
import { useSaveNoiseEstimate } from '../api/save-noise-estimate';

type Values = NoiseEstimateInput;

const numberOrUndefined = (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value));
const blankRow = () => ({ laeqDb: undefined as unknown as number, durationMinutes: undefined });
const blankTask = () => ({
  name: '',
  hours: undefined as unknown as number,
  durationUncertaintyHours: undefined,
  measurements: [blankRow(), blankRow(), blankRow()],
});

/** Only the part of the form the chosen strategy uses is sent (tasks, or loose measurements). */
function relevantPart(values: Values): Values {
  return values.strategy === 'task-based'
    ? { ...values, measurements: [], effectiveHours: undefined, groupSize: undefined }
    : { ...values, tasks: [], groupSize: values.strategy === 'job-based' ? values.groupSize : undefined };
}
const schemaResolver = zodResolver(noiseEstimateInput);
const resolver: Resolver<Values, unknown, NoiseEstimateParsed> = (values, context, options) =>
  schemaResolver(relevantPart(values), context, options) as ReturnType<Resolver<Values, unknown, NoiseEstimateParsed>>;

function defaultsOf(estimate: NoiseEstimateView | null): Values {
  if (!estimate)
    return {
      title: '',
      strategy: 'task-based',
      instrument: 'class1-meter',
      notes: '',
      tasks: [blankTask()],
      measurements: [blankRow(), blankRow(), blankRow(), blankRow(), blankRow()],
    };
  const row = (measurement: NoiseEstimateView['measurements'][number]) => ({
    laeqDb: measurement.laeqDb,
    durationMinutes: measurement.durationMinutes ?? undefined,
    measuredOn: measurement.measuredOn ?? undefined,
    workerId: measurement.workerId ?? undefined,
  });
  return {
    title: estimate.title,
    strategy: estimate.strategy,
    instrument: estimate.instrument,
    effectiveHours: estimate.effectiveHours ?? undefined,
    groupSize: estimate.groupSize ?? undefined,
    notes: estimate.notes,
    tasks: estimate.tasks.map((task) => ({
      name: task.name,
      hours: task.hours,
      durationUncertaintyHours: task.durationUncertaintyHours ?? undefined,
      measurements: task.measurements.map(row),
    })),
    measurements: estimate.measurements.map(row),
  };
}

/** A message react-hook-form keeps for an array (a zod issue on the array itself). */
function arrayMessage(error: unknown): string | undefined {
  const value = error as { message?: string; root?: { message?: string } } | undefined;
  return value?.message ?? value?.root?.message;
}

const cell = 'px-2 py-1 align-top';
const numberInput = 'input w-28';

/** The measurement rows of one task, or the samples/days of a job-based or full-day estimate. */
function MeasurementRows({
  control,
  register,
  name,
  rowLabel,
  errors,
  withDates,
  offer,
}: {
  control: Control<Values, unknown, NoiseEstimateParsed>;
  register: UseFormRegister<Values>;
  name: 'measurements' | `tasks.${number}.measurements`;
  rowLabel: string;
  errors: FieldErrors<Values>['measurements'];
  withDates: boolean;
  /** Rows the form can be filled with in one step (accepted noise-log days), if any. */
  offer?: { label: string; rows: Values['measurements'] };
}) {
  const rows = useFieldArray({ control, name });
  const rowErrors = errors as
    Array<{ laeqDb?: { message?: string }; durationMinutes?: { message?: string }; measuredOn?: { message?: string } } | undefined> | undefined;
  return (
    <div className="space-y-1">
      <table className="text-sm">
        <thead>
          <tr className="text-left text-xs text-slate-600">
            <th className={cell}>#</th>
            <th className={cell}>LAeq (dB)</th>
            <th className={cell}>Duration (min)</th>
            {withDates && <th className={cell}>Date</th>}
            <th className={cell}>
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.fields.map((field, index) => {
            const rowError = rowErrors?.[index];
            const label = `${rowLabel} ${index + 1}`;
            return (
              <tr key={field.id}>
                <td className={cell}>{index + 1}</td>
                <td className={cell}>
                  <input
                    aria-label={`${label} LAeq (dB)`}
                    inputMode="decimal"
                    className={numberInput}
                    aria-invalid={rowError?.laeqDb ? true : undefined}
                    {...register(`${name}.${index}.laeqDb` as Path<Values>, { setValueAs: numberOrUndefined })}
                  />
                  {rowError?.laeqDb && <p className="text-xs font-medium text-red-800">{rowError.laeqDb.message}</p>}
                </td>
                <td className={cell}>
                  <input
                    aria-label={`${label} duration (minutes)`}
                    inputMode="decimal"
                    className={numberInput}
                    aria-invalid={rowError?.durationMinutes ? true : undefined}
                    {...register(`${name}.${index}.durationMinutes` as Path<Values>, { setValueAs: numberOrUndefined })}
                  />
                  {rowError?.durationMinutes && <p className="text-xs font-medium text-red-800">{rowError.durationMinutes.message}</p>}
                </td>
                {withDates && (
                  <td className={cell}>
                    <input
                      type="date"
                      aria-label={`${label} date`}
                      className="input"
                      {...register(`${name}.${index}.measuredOn` as Path<Values>, { setValueAs: (value) => (value === '' ? undefined : value) })}
                    />
                    {rowError?.measuredOn && <p className="text-xs font-medium text-red-800">{rowError.measuredOn.message}</p>}
                  </td>
                )}
                <td className={cell}>
                  <Button size="sm" variant="ghost" onClick={() => rows.remove(index)} aria-label={`Remove ${label.toLowerCase()}`}>
                    Remove
                  </Button>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {arrayMessage(errors) && (
        <p role="alert" className="text-xs font-medium text-red-800">
          {arrayMessage(errors)}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button size="sm" onClick={() => rows.append(blankRow())}>
          Add {rowLabel.toLowerCase().replace(/^task \d+ /, '')}
        </Button>
        {offer && offer.rows && offer.rows.length > 0 && (
          <Button size="sm" onClick={() => rows.replace(offer.rows ?? [])}>
            {offer.label}
          </Button>
        )}
      </div>
    </div>
  );
}

/**
 * Enter or change an ISO 9612 estimate: the strategy, the instrument, then the tasks with their
 * measurements (task-based) or the samples or days (job-based, full-day), in editable tables. The
 * same schema as the server checks the form, so a task with fewer than 3 measurements or a
 * negative duration is marked at its row before anything is sent.
 */
export function EstimateForm({
  organizationId,
  groupId,
  estimate,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  groupId: number;
  estimate: NoiseEstimateView | null;
  onSaved: (estimate: NoiseEstimateView) => void;
  onCancel: () => void;
}) {
  const save = useSaveNoiseEstimate(organizationId);
  const form = useForm<Values, unknown, NoiseEstimateParsed>({ resolver, defaultValues: defaultsOf(estimate) });
  const tasks = useFieldArray({ control: form.control, name: 'tasks' });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;
  const strategy = form.watch('strategy');
  const noiseLogDays = useNoiseLogDays(organizationId, groupId, strategy === 'full-day');
  const dayOffer =
    strategy === 'full-day' && noiseLogDays.data && noiseLogDays.data.length > 0
      ? {
          label: `Fill with the ${noiseLogDays.data.length} accepted noise-log day${noiseLogDays.data.length === 1 ? '' : 's'}`,
          rows: noiseLogDays.data.map((day) => ({
            laeqDb: day.laeqDb,
            durationMinutes: day.durationMinutes ?? undefined,
            measuredOn: day.measuredOn,
            workerId: day.workerId,
          })),
        }
      : undefined;

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      onSaved(await save.mutateAsync({ groupId, estimateId: estimate?.id ?? null, estimate: values }));
    } catch (error) {
      if (isApiError(error)) {
        for (const [field, message] of Object.entries(error.fields ?? {})) form.setError(field as Path<Values>, { type: 'server', message });
      }
      setFormError(error instanceof Error ? error.message : 'Could not save the estimate. Try again.');
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-4" aria-label={estimate ? 'Change the estimate' : 'New estimate'}>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Title (optional)" autoComplete="off" error={errors.title?.message} {...form.register('title')} />
        <SelectField
          label="Strategy"
          options={noiseStrategies.map((value) => ({ value, label: noiseStrategyLabels[value] }))}
          error={errors.strategy?.message}
          {...form.register('strategy')}
        />
        <SelectField
          label="Instrument"
          options={noiseInstruments.map((value) => ({ value, label: noiseInstrumentLabels[value] }))}
          hint="Sets u2 by ISO 9612 Table C.5; the microphone position adds u3 = 1.0 dB."
          error={errors.instrument?.message}
          {...form.register('instrument')}
        />
        {strategy !== 'task-based' && (
          <TextField
            label="Effective day Te (hours)"
            inputMode="decimal"
            error={errors.effectiveHours?.message}
            {...form.register('effectiveHours', { setValueAs: numberOrUndefined })}
          />
        )}
        {strategy === 'job-based' && (
          <TextField
            label="Workers in the group (nG)"
            inputMode="numeric"
            hint="For the minimum cumulative duration of ISO 9612 Table 1."
            error={errors.groupSize?.message}
            {...form.register('groupSize', { setValueAs: numberOrUndefined })}
          />
        )}
      </div>

      {strategy === 'task-based' ? (
        <fieldset className="space-y-4">
          <legend className="text-sm font-semibold text-slate-900">Tasks of the nominal day (Te is their sum; at least 3 measurements each)</legend>
          {tasks.fields.map((field, index) => {
            const taskErrors = errors.tasks?.[index];
            return (
              <div key={field.id} className="space-y-2 rounded-md border border-slate-200 p-3">
                <div className="grid gap-3 sm:grid-cols-[2fr_1fr_1fr_auto] sm:items-end">
                  <TextField label={`Task ${index + 1} name`} autoComplete="off" error={taskErrors?.name?.message} {...form.register(`tasks.${index}.name`)} />
                  <TextField
                    label={`Task ${index + 1} duration (hours)`}
                    inputMode="decimal"
                    error={taskErrors?.hours?.message}
                    {...form.register(`tasks.${index}.hours`, { setValueAs: numberOrUndefined })}
                  />
                  <TextField
                    label={`Task ${index + 1} duration uncertainty (hours, optional)`}
                    inputMode="decimal"
                    error={taskErrors?.durationUncertaintyHours?.message}
                    {...form.register(`tasks.${index}.durationUncertaintyHours`, { setValueAs: numberOrUndefined })}
                  />
                  <Button variant="ghost" onClick={() => tasks.remove(index)}>
                    Remove task {index + 1}
                  </Button>
                </div>
                <MeasurementRows
                  control={form.control}
                  register={form.register}
                  name={`tasks.${index}.measurements`}
                  rowLabel={`Task ${index + 1} measurement`}
                  errors={taskErrors?.measurements as FieldErrors<Values>['measurements']}
                  withDates={false}
                />
              </div>
            );
          })}
          {arrayMessage(errors.tasks) && (
            <p role="alert" className="text-xs font-medium text-red-800">
              {arrayMessage(errors.tasks)}
            </p>
          )}
          <Button onClick={() => tasks.append(blankTask())}>Add a task</Button>
        </fieldset>
      ) : (
        <fieldset className="space-y-2">
          <legend className="text-sm font-semibold text-slate-900">
            {strategy === 'job-based'
              ? 'Samples (at least 5, taken at random over the group’s work)'
              : 'Full days (at least 3, each over the whole effective day)'}
          </legend>
          <MeasurementRows
            control={form.control}
            register={form.register}
            name="measurements"
            rowLabel={strategy === 'job-based' ? 'Sample' : 'Day'}
            errors={errors.measurements}
            withDates
            offer={dayOffer}
          />
          {dayOffer && (
            <p className="text-xs text-slate-600">
              Each accepted noise log gives its reviewed LAeq over the logged run; check that each run covers the whole effective day before you use it as a
              full day.
            </p>
          )}
        </fieldset>
      )}
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      <FormActions error={formError} submitLabel={estimate ? 'Save and recompute' : 'Compute and save'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
