import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm, type FieldPath } from 'react-hook-form';
import type { z } from 'zod';
import { exposureUnitLabels, exposureUnits, type ExposureUnit } from '@schema/agents';
import { dateFormats, labImportCommit, labImportFields, type DateFormat, type LabImportCommit, type LabImportField } from '@schema/lab-imports';
import { Button } from '@frontend/components/button';
import { SelectField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { formatCalendarDate, formatNumber } from '@frontend/lib/format';
import { useCheckLabImport } from '../api/check-lab-import';
import { useCommitLabImport, type LabImportCommitted } from '../api/commit-lab-import';
import { importProblems, type ImportBatchSummary, type LabImportCheck, type LabImportPreview, type LabImportProblem } from '../api/types';
import { ImportProblems } from './import-problems';

type FormValues = z.input<typeof labImportCommit>;

/** Each field the file's columns can feed, in plain words. */
const fieldText: Record<LabImportField, { label: string; hint?: string; required?: boolean }> = {
  workerCode: { label: 'Worker code', required: true },
  date: { label: 'Shift date', required: true },
  value: { label: 'Value', required: true, hint: 'A number, or a non-detect written “<0.02” (its detection limit) or “<LOD” / “ND”.' },
  group: { label: 'Exposure group', hint: 'Group name or id. Without this column, choose one group for every row below.' },
  agent: { label: 'Agent', hint: 'Optional check: name or CAS number must be the group’s agent.' },
  unit: { label: 'Unit', hint: 'mg/m3, µg/m3, ppm, f/cc, dBA or % dose. Without it, choose one unit below.' },
  detectionLimit: { label: 'Detection limit (LOD)', hint: 'For non-detects written “<LOD” or “ND”.' },
  sampleId: { label: 'Sample id' },
  lab: { label: 'Lab' },
  startTime: { label: 'Sample start', hint: 'HH:MM; with the end time, gives the minutes.' },
  endTime: { label: 'Sample end' },
  minutes: { label: 'Minutes sampled', hint: 'Instead of start and end times.' },
};
const fieldGroups: ReadonlyArray<{ title: string; fields: readonly LabImportField[] }> = [
  { title: 'Who, when and what', fields: ['workerCode', 'date', 'group', 'agent'] },
  { title: 'The measurement', fields: ['value', 'unit', 'detectionLimit'] },
  { title: 'The sample', fields: ['sampleId', 'lab', 'startTime', 'endTime', 'minutes'] },
];

const assumptions = [
  {
    value: 'zero',
    label: 'No exposure when no sample ran',
    text: 'Adds up concentration × minutes of the samples and divides by the whole shift. Right when the unsampled time was spent away from the agent (breaks, another area).',
  },
  {
    value: 'sampled-average',
    label: 'The unsampled time was like the sampled time',
    text: 'Averages over the sampled minutes only, as if the rest of the shift was exposed at that average. Right when the samples are typical of the whole shift.',
  },
] as const;

const nullIfEmpty = (value: unknown) => (value === '' || value === undefined ? null : value);
const undefinedIfEmpty = (value: unknown) => (value === '' || value === null ? undefined : value);
const numberOrUndefined = (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value));

/** A guess at the file's date format from the date column's examples; the person can change it. */
function guessDateFormat(examples: readonly string[]): DateFormat {
  if (examples.every((example) => /^\d{4}-\d{2}-\d{2}$/.test(example.trim()))) return 'YYYY-MM-DD';
  const parts = examples.map((example) => /^(\d{1,2})[/.-](\d{1,2})[/.-]\d{4}$/.exec(example.trim())).filter((match) => match !== null);
  if (parts.some((match) => Number(match[2]) > 12)) return 'MM/DD/YYYY';
  return parts.length > 0 ? 'DD/MM/YYYY' : 'YYYY-MM-DD';
}

/**
 * Map the file's columns to the fields of a shift result, say what the file leaves unsaid (one
 * group or unit for every row, the date format, what unsampled time counts as, the shift length),
 * check the file as a dry run, and import it. Every refusal lists each bad row by row and column;
 * nothing is stored until the whole file is right.
 */
export function MappingForm({
  organizationId,
  batch,
  preview,
  groups,
  onCommitted,
}: {
  organizationId: string;
  batch: ImportBatchSummary;
  preview: LabImportPreview;
  groups: ReadonlyArray<{ id: number; name: string; siteName: string; unit: ExposureUnit }>;
  onCommitted: (committed: LabImportCommitted) => void;
}) {
  const check = useCheckLabImport(organizationId);
  const commit = useCommitLabImport(organizationId);
  const columnOptions = [{ value: '', label: '— not in the file —' }, ...preview.columns.map((column) => ({ value: column.name, label: column.name }))];
  const dateColumn = preview.columns.find((column) => column.name === preview.suggestedMapping.date);
  const form = useForm<FormValues, unknown, LabImportCommit>({
    resolver: zodResolver(labImportCommit),
    defaultValues: {
      mapping: Object.fromEntries(labImportFields.map((field) => [field, preview.suggestedMapping[field] ?? ''])) as FormValues['mapping'],
      defaults: { exposureGroupId: undefined, unit: undefined },
      dateFormat: guessDateFormat(dateColumn?.examples ?? []),
      unsampledTime: undefined,
      shiftHours: undefined,
    },
  });
  const [outcome, setOutcome] = useState<
    { kind: 'checked'; check: LabImportCheck } | { kind: 'problems'; problems: LabImportProblem[] } | { kind: 'error'; message: string } | null
  >(null);
  const [action, setAction] = useState<'check' | 'commit'>('check');
  const { errors, isSubmitting } = form.formState;
  const assumptionName = useId();
  const mapping = form.watch('mapping');
  const unsampledTime = form.watch('unsampledTime');
  const formFields = [
    ...labImportFields.map((field) => `mapping.${field}` as const),
    'defaults.exposureGroupId',
    'defaults.unit',
    'dateFormat',
    'unsampledTime',
    'shiftHours',
  ] as ReadonlyArray<FieldPath<FormValues>>;

  const run = (which: 'check' | 'commit') =>
    form.handleSubmit(async (values) => {
      setOutcome(null);
      // A mapped column wins over a value for every row: send only what applies.
      const input: LabImportCommit = {
        ...values,
        defaults: {
          exposureGroupId: values.mapping.group ? undefined : values.defaults.exposureGroupId,
          unit: values.mapping.unit ? undefined : values.defaults.unit,
        },
      };
      try {
        if (which === 'check') setOutcome({ kind: 'checked', check: await check.mutateAsync({ batchId: batch.id, commit: input }) });
        else onCommitted(await commit.mutateAsync({ batchId: batch.id, commit: input }));
      } catch (error) {
        const problems = importProblems(error);
        const message = applyServerErrorsInline(error, form.setError, formFields);
        setOutcome(problems ? { kind: 'problems', problems } : { kind: 'error', message });
      }
    });

  return (
    <form
      noValidate
      onSubmit={(event) => {
        // Enter in a field runs the check (the safe action); importing needs its own button.
        event.preventDefault();
        setAction('check');
        void run('check')(event);
      }}
      className="space-y-5"
    >
      <section aria-labelledby="mapping-title" className="card space-y-4 p-4">
        <div>
          <h2 id="mapping-title" className="text-base">
            Which column holds what
          </h2>
          <p className="text-sm text-slate-600">Suggested from the column names; change any that are wrong. Worker code, date and value are required.</p>
        </div>
        {fieldGroups.map((group) => (
          <fieldset key={group.title} className="space-y-2">
            <legend className="text-xs font-semibold tracking-wide text-slate-500 uppercase">{group.title}</legend>
            <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
              {group.fields.map((field) => {
                const text = fieldText[field];
                const examples = preview.columns.find((column) => column.name === mapping[field])?.examples;
                return (
                  <SelectField
                    key={field}
                    label={`${text.label}${text.required ? '' : ' (optional)'}`}
                    options={columnOptions}
                    hint={
                      <>
                        {text.hint}
                        {examples && examples.length > 0 && <span className="block text-slate-500">e.g. {examples.join(', ')}</span>}
                      </>
                    }
                    error={errors.mapping?.[field]?.message}
                    {...form.register(`mapping.${field}`, { setValueAs: text.required ? undefined : nullIfEmpty })}
                  />
                );
              })}
            </div>
          </fieldset>
        ))}
      </section>

      <section aria-labelledby="options-title" className="card space-y-4 p-4">
        <h2 id="options-title" className="text-base">
          What the file does not say
        </h2>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {!mapping.group && (
            <SelectField
              label="Exposure group for every row"
              options={[{ value: '', label: 'Choose…' }, ...groups.map((group) => ({ value: String(group.id), label: `${group.name} (${group.siteName})` }))]}
              error={errors.defaults?.exposureGroupId?.message ?? errors.mapping?.group?.message}
              {...form.register('defaults.exposureGroupId', { setValueAs: numberOrUndefined })}
            />
          )}
          {!mapping.unit && (
            <SelectField
              label="Unit of every value"
              options={[{ value: '', label: 'Choose…' }, ...exposureUnits.map((unit) => ({ value: unit, label: exposureUnitLabels[unit] }))]}
              hint="Converted to each group's OEL unit (ppm ↔ mg/m³ at 25 °C from the agent's molecular weight)."
              error={errors.defaults?.unit?.message ?? errors.mapping?.unit?.message}
              {...form.register('defaults.unit', { setValueAs: undefinedIfEmpty })}
            />
          )}
          <SelectField
            label="Date format"
            options={dateFormats.map((format) => ({ value: format, label: format }))}
            hint={dateColumn ? `The date column reads e.g. ${dateColumn.examples.slice(0, 2).join(', ')}.` : undefined}
            error={errors.dateFormat?.message}
            {...form.register('dateFormat')}
          />
          <TextField
            label="Shift length, hours (optional)"
            inputMode="decimal"
            hint="For every row; empty: each group's own shift length."
            error={errors.shiftHours?.message}
            {...form.register('shiftHours', { setValueAs: numberOrUndefined })}
          />
        </div>

        <fieldset className="space-y-2" aria-describedby={`${assumptionName}-hint`}>
          <legend className="text-sm font-medium text-slate-800">Several samples in one shift: what does the unsampled time count as?</legend>
          <p id={`${assumptionName}-hint`} className="text-xs text-slate-600">
            Samples of the same worker, date and group are combined into one shift TWA, Σ(concentration × minutes) ÷ time. It needs the samples' minutes (or
            start and end times), and a choice for the part of the shift no sample covered. Each result records the choice in words.
          </p>
          <div className="grid gap-2 md:grid-cols-3">
            {[
              ...assumptions,
              {
                value: '',
                label: 'Nothing to combine',
                text: 'Every row is already a whole-shift result. If a shift turns out to need combining, the check says which.',
              },
            ].map((option) => (
              <label
                key={option.value}
                className={`flex cursor-pointer gap-2 rounded border px-3 py-2 text-sm ${(unsampledTime ?? '') === option.value ? 'border-primary-500 bg-primary-50' : 'border-slate-300 bg-white'}`}
              >
                <input
                  type="radio"
                  name={assumptionName}
                  value={option.value}
                  checked={(unsampledTime ?? '') === option.value}
                  onChange={() => {
                    form.setValue('unsampledTime', option.value === '' ? undefined : (option.value as LabImportCommit['unsampledTime']), { shouldDirty: true });
                    form.clearErrors('unsampledTime');
                  }}
                  className="mt-0.5 size-4 shrink-0 accent-primary-700"
                />
                <span>
                  <span className="block font-medium text-slate-900">{option.label}</span>
                  <span className="block text-xs text-slate-600">{option.text}</span>
                </span>
              </label>
            ))}
          </div>
          {errors.unsampledTime?.message && <p className="text-xs font-medium text-red-800">{errors.unsampledTime.message}</p>}
        </fieldset>
        <p className="text-xs text-slate-600">
          Long shifts: a group judged with the Brief & Scala extended-shift adjustment has its limit lowered on the group itself (edit the group to change it);
          the imported results are stored as measured.
        </p>
      </section>

      {outcome?.kind === 'problems' && (
        <ImportProblems problems={outcome.problems} title={action === 'commit' ? 'The file was not imported' : 'The check found problems'} />
      )}
      {outcome?.kind === 'error' && <Notice tone="error">{outcome.message}</Notice>}
      {outcome?.kind === 'checked' && <CheckedResults check={outcome.check} />}

      <div className="flex flex-wrap items-center justify-end gap-2">
        <p className="mr-auto text-sm text-slate-600">All or nothing: one bad row stops the whole import, and every problem is listed.</p>
        <Button type="submit" pending={isSubmitting && action === 'check'} onClick={() => setAction('check')}>
          Check the file
        </Button>
        <Button
          variant="primary"
          pending={isSubmitting && action === 'commit'}
          onClick={(event) => {
            setAction('commit');
            void run('commit')(event);
          }}
        >
          Import results
        </Button>
      </div>
    </form>
  );
}

/** What a check found: the results the import would store. */
function CheckedResults({ check }: { check: LabImportCheck }) {
  return (
    <div role="status" className="space-y-2 rounded-md border border-emerald-300 bg-emerald-50 px-4 py-3 text-sm text-emerald-950">
      <p className="font-semibold">
        The file is ready: {check.resultCount} shift result{check.resultCount === 1 ? '' : 's'} would be stored. Nothing is stored until you import.
      </p>
      <div className="max-h-72 overflow-auto rounded border border-emerald-200 bg-white text-slate-900">
        <table className="table-dense w-full">
          <caption className="sr-only">Results the import would store</caption>
          <thead className="sticky top-0">
            <tr>
              <th scope="col">Rows</th>
              <th scope="col">Worker</th>
              <th scope="col">Date</th>
              <th scope="col">Group</th>
              <th scope="col">Result</th>
              <th scope="col">How</th>
            </tr>
          </thead>
          <tbody>
            {check.results.map((result) => (
              <tr key={result.rows.join('-')}>
                <td className="tabular-nums">{result.rows.join(', ')}</td>
                <td className="font-medium tabular-nums">{result.workerCode}</td>
                <td className="whitespace-nowrap tabular-nums">{formatCalendarDate(result.date)}</td>
                <td>{result.exposureGroupName}</td>
                <td className="whitespace-nowrap tabular-nums">
                  {result.nonDetect ? '< ' : ''}
                  {formatNumber(result.value, 4)} {exposureUnitLabels[result.unit]}
                </td>
                <td className="max-w-md text-xs text-slate-600">{result.statement}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
