import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useId, useRef, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import type { z } from 'zod';
import { averagingTimeLabels, averagingTimes, exposureUnitLabels, unitsForAgentKind, type AgentKind } from '@schema/agents';
import { exposureGroupCreate, type ExposureGroupCreate, type NoiseCriteriaSet } from '@schema/exposure-groups';
import { briefScalaReductionFactor } from '@stats/extended-shift';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import type { ExposureGroupView } from '@frontend/lib/api-types';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { formatNumber } from '@frontend/lib/format';
import { useCreateExposureGroup } from '../api/create-exposure-group';
import { useUpdateExposureGroup } from '../api/update-exposure-group';

type FormValues = z.input<typeof exposureGroupCreate>;

/** A choice for the form's selects (sites, agents, OEL list entries). */
export interface Choice {
  id: number;
  name: string;
}
export interface AgentChoice extends Choice {
  kind: AgentKind;
}
export interface OelChoice {
  id: number;
  agentId: number;
  source: string;
  value: number;
  unit: ExposureGroupCreate['oelUnit'] & string;
  averagingTime: (typeof averagingTimes)[number];
}

export const noiseCriteriaSetLabels: Record<NoiseCriteriaSet, string> = {
  nioshRel: '85 dB criterion, 3 dB exchange rate, 80 dB threshold',
  oshaPel: '90 dB criterion, 5 dB exchange rate, 90 dB threshold',
  oshaHc: '90 dB criterion, 5 dB exchange rate, 80 dB threshold (hearing conservation)',
  iso: 'LAeq and LEX,8h (equal energy)',
};
const criteriaOptions = [
  { value: '', label: 'Choose…' },
  ...(Object.keys(noiseCriteriaSetLabels) as NoiseCriteriaSet[]).map((value) => ({ value, label: noiseCriteriaSetLabels[value] })),
];
const averagingOptions = averagingTimes.map((value) => ({ value, label: averagingTimeLabels[value] }));

const numberOrUndefined = (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value));
const numberOrNull = (value: unknown) => (value === '' || value === null || value === undefined ? null : Number(value));
const idOrUndefined = (value: unknown) => (value === '' || value === undefined ? undefined : Number(value));
const emptyToNull = (value: unknown) => (value === '' || value === undefined ? null : value);

const oelFields = ['oelValue', 'oelUnit', 'oelSource', 'oelAveragingTime'] as const;
const formFields = [
  'siteId',
  'name',
  'processArea',
  'jobTitles',
  'tasks',
  'agentId',
  'oelEntryId',
  ...oelFields,
  'actionLevel',
  'shiftHours',
  'noiseCriteriaSet',
  'exposureProfile',
  'extendedShiftAdjustment',
] as const;

/** Job titles, one per line: its own text while typing, an array for the form. */
function JobTitlesField({
  value,
  onChange,
  onBlur,
  error,
}: {
  value: string[] | undefined;
  onChange: (titles: string[]) => void;
  onBlur: () => void;
  error?: string;
}) {
  const [text, setText] = useState(() => (value ?? []).join('\n'));
  return (
    <TextAreaField
      label="Job titles"
      hint="One per line, as the payroll or the rota writes them."
      rows={3}
      value={text}
      error={error}
      onBlur={onBlur}
      onChange={(event) => {
        setText(event.target.value);
        onChange(
          event.target.value
            .split('\n')
            .map((line) => line.trim())
            .filter((line) => line !== ''),
        );
      }}
    />
  );
}

/**
 * Set up or edit an exposure group: where and who (site, process or area, job titles, tasks), the
 * agent and the limit it is judged against, the action level, the shift length and the exposure
 * profile. The limit is taken from the organization's OEL list (copied onto the group) or typed
 * in. Checked with the server's schema; the server's answers appear under the fields.
 */
export function GroupForm({
  organizationId,
  group,
  sites,
  agents,
  oelEntries,
  agentOfEntries,
  onAgentChange,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  group?: ExposureGroupView;
  sites: readonly Choice[];
  agents: readonly AgentChoice[];
  /** The OEL list entries of the agent currently chosen (loaded by the page). */
  oelEntries: readonly OelChoice[];
  /** Which agent `oelEntries` belong to (they may still be loading for a new choice). */
  agentOfEntries: number | undefined;
  onAgentChange: (agentId: number | undefined) => void;
  onSaved: (group: ExposureGroupView) => void;
  onCancel: () => void;
}) {
  const create = useCreateExposureGroup(organizationId);
  const update = useUpdateExposureGroup(organizationId);
  const [oelMode, setOelMode] = useState<'list' | 'typed'>(group ? (group.oelEntryId !== null ? 'list' : 'typed') : 'list');
  // With a list entry chosen, the typed-in OEL fields are hidden and not sent: leave them out of
  // the check too, or a blank hidden field would block the form without a visible message.
  const oelModeRef = useRef(oelMode);
  oelModeRef.current = oelMode;
  const form = useForm<FormValues, unknown, ExposureGroupCreate>({
    resolver: (values, context, options) =>
      zodResolver(exposureGroupCreate)(
        oelModeRef.current === 'list' ? { ...values, oelValue: undefined, oelUnit: undefined, oelSource: undefined, oelAveragingTime: undefined } : values,
        context,
        options,
      ),
    defaultValues: {
      siteId: group?.siteId ?? sites[0]?.id,
      name: group?.name ?? '',
      processArea: group?.processArea ?? '',
      jobTitles: group?.jobTitles ?? [],
      tasks: group?.tasks ?? '',
      agentId: group?.agentId ?? agents[0]?.id,
      oelEntryId: group?.oelEntryId ?? null,
      oelValue: group?.oelValue,
      oelUnit: group?.oelUnit,
      oelSource: group?.oelSource ?? '',
      oelAveragingTime: group?.oelAveragingTime ?? '8h-twa',
      actionLevel: group?.actionLevel ?? null,
      shiftHours: group?.shiftHours ?? 8,
      noiseCriteriaSet: group?.noiseCriteriaSet ?? null,
      exposureProfile: group?.exposureProfile ?? '',
      extendedShiftAdjustment: group?.extendedShiftAdjustment ?? 'none',
    },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;
  const modeName = useId();

  const agentId = form.watch('agentId');
  const agent = agents.find((candidate) => candidate.id === Number(agentId));
  const kind: AgentKind = agent?.kind ?? group?.agentKind ?? 'chemical';
  const units = unitsForAgentKind[kind];
  const oelEntryId = form.watch('oelEntryId');
  const chosenEntry = oelEntries.find((entry) => entry.id === Number(oelEntryId));
  const entriesReady = agentOfEntries === Number(agentId);
  const shiftHours = Number(form.watch('shiftHours'));
  const averagingTime = oelMode === 'list' ? chosenEntry?.averagingTime : form.watch('oelAveragingTime');
  const briefScalaAllowed = kind === 'chemical' && averagingTime === '8h-twa';

  // Tell the page which agent's OEL list to load.
  useEffect(() => onAgentChange(agent?.id), [agent?.id, onAgentChange]);

  // A new agent: its own limits, units and (for noise) a criteria set.
  function agentChanged(nextId: number | undefined) {
    const next = agents.find((candidate) => candidate.id === nextId);
    form.setValue('oelEntryId', null);
    if (next && !unitsForAgentKind[next.kind].includes(form.getValues('oelUnit') as never)) form.setValue('oelUnit', unitsForAgentKind[next.kind][0]);
    if (next?.kind !== 'noise') form.setValue('noiseCriteriaSet', null);
    if (next?.kind !== 'chemical') form.setValue('extendedShiftAdjustment', 'none');
  }

  // With the list chosen, pick the first entry once they load (a new group only).
  useEffect(() => {
    if (oelMode === 'list' && entriesReady && oelEntries.length > 0 && form.getValues('oelEntryId') == null) form.setValue('oelEntryId', oelEntries[0].id);
  }, [oelMode, entriesReady, oelEntries, form]);

  const submit = form.handleSubmit(
    async (values) => {
      setFormError(null);
      if (oelMode === 'list' && values.oelEntryId == null) {
        form.setError('oelEntryId', { type: 'manual', message: 'Choose a limit from the OEL list, or type the limit in' });
        return;
      }
      // From the list: the server copies value, unit, source and averaging time from the entry.
      const input: ExposureGroupCreate =
        oelMode === 'list'
          ? { ...values, oelValue: undefined, oelUnit: undefined, oelSource: undefined, oelAveragingTime: undefined }
          : { ...values, oelEntryId: null };
      if (!briefScalaAllowed) input.extendedShiftAdjustment = 'none';
      try {
        onSaved(group ? await update.mutateAsync({ groupId: group.id, changes: input }) : await create.mutateAsync(input));
      } catch (error) {
        setFormError(applyServerErrorsInline(error, form.setError, formFields));
      }
    },
    () => setFormError('Check the fields marked above.'),
  );

  const agentOptions = agents.map((choice) => ({
    value: String(choice.id),
    label: `${choice.name} (${choice.kind === 'noise' ? 'noise' : choice.kind === 'mixture' ? 'mixture, OEL 1' : 'chemical'})`,
  }));
  if (group && !agents.some((choice) => choice.id === group.agentId)) agentOptions.unshift({ value: String(group.agentId), label: group.agentName });
  const siteOptions = sites.map((site) => ({ value: String(site.id), label: site.name }));
  if (group && !sites.some((site) => site.id === group.siteId)) siteOptions.unshift({ value: String(group.siteId), label: group.siteName });
  const entryOptions = [
    { value: '', label: entriesReady ? (oelEntries.length === 0 ? 'No limits for this agent in the OEL list' : 'Choose…') : 'Loading the OEL list…' },
    ...oelEntries.map((entry) => ({
      value: String(entry.id),
      label: `${formatNumber(entry.value, 6)} ${exposureUnitLabels[entry.unit]}, ${averagingTimeLabels[entry.averagingTime]} — ${entry.source}`,
    })),
  ];
  const oelUnitLabel = exposureUnitLabels[(oelMode === 'list' ? chosenEntry?.unit : form.watch('oelUnit')) ?? units[0]];

  return (
    <form noValidate onSubmit={submit} className="space-y-6">
      <fieldset className="card space-y-3 p-4">
        <legend className="px-1 text-sm font-semibold text-slate-900">Who and where</legend>
        <div className="grid gap-3 md:grid-cols-2">
          <TextField
            label="Name"
            autoComplete="off"
            hint="Job and agent, e.g. “Planer feeder – noise”."
            error={errors.name?.message}
            {...form.register('name')}
          />
          <SelectField label="Site" options={siteOptions} error={errors.siteId?.message} {...form.register('siteId', { setValueAs: idOrUndefined })} />
          <TextField label="Process or area" autoComplete="off" error={errors.processArea?.message} {...form.register('processArea')} />
          <Controller
            control={form.control}
            name="jobTitles"
            render={({ field }) => (
              <JobTitlesField
                value={field.value}
                onChange={field.onChange}
                onBlur={field.onBlur}
                error={errors.jobTitles?.message ?? (Array.isArray(errors.jobTitles) ? errors.jobTitles.find(Boolean)?.message : undefined)}
              />
            )}
          />
        </div>
        <TextAreaField label="Tasks" hint="What the workers do during a shift." error={errors.tasks?.message} {...form.register('tasks')} />
        <TextAreaField
          label="Exposure profile"
          hint="How exposure arises and varies: sources, controls, what changes from day to day."
          error={errors.exposureProfile?.message}
          {...form.register('exposureProfile')}
        />
      </fieldset>

      <fieldset className="card space-y-3 p-4">
        <legend className="px-1 text-sm font-semibold text-slate-900">Agent and limit</legend>
        <div className="grid gap-3 md:grid-cols-2">
          <SelectField
            label="Agent"
            options={agentOptions}
            error={errors.agentId?.message}
            hint={group && group.validResultCount + group.voidResultCount > 0 ? 'The group has results: its agent and unit can no longer change.' : undefined}
            {...form.register('agentId', { setValueAs: idOrUndefined, onChange: (event) => agentChanged(idOrUndefined(event.target.value)) })}
          />
          {kind === 'noise' && (
            <SelectField
              label="Noise criteria set"
              options={criteriaOptions}
              error={errors.noiseCriteriaSet?.message}
              {...form.register('noiseCriteriaSet', { setValueAs: emptyToNull })}
            />
          )}
        </div>

        <div role="radiogroup" aria-label="Where the limit comes from" className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
          {(
            [
              ['list', 'From the OEL list'],
              ['typed', 'Type the limit in'],
            ] as const
          ).map(([value, label]) => (
            <label key={value} className="flex items-center gap-2">
              <input
                type="radio"
                name={modeName}
                value={value}
                checked={oelMode === value}
                className="size-4 accent-primary-700"
                onChange={() => {
                  setOelMode(value);
                  if (value === 'typed') {
                    // Start from the chosen entry's figures, if any, so a small change is easy.
                    if (chosenEntry) {
                      form.setValue('oelValue', chosenEntry.value);
                      form.setValue('oelUnit', chosenEntry.unit);
                      form.setValue('oelSource', chosenEntry.source);
                      form.setValue('oelAveragingTime', chosenEntry.averagingTime);
                    }
                    form.setValue('oelEntryId', null);
                  }
                }}
              />
              {label}
            </label>
          ))}
        </div>

        {oelMode === 'list' ? (
          <SelectField
            label="Limit from the OEL list"
            options={entryOptions}
            error={errors.oelEntryId?.message}
            hint="The value, unit, source and averaging time are copied onto the group: a later change to the list does not change this group."
            {...form.register('oelEntryId', { setValueAs: (value) => (value === '' || value == null ? null : Number(value)) })}
          />
        ) : (
          <div className="grid gap-3 md:grid-cols-[8rem_10rem_1fr_14rem]">
            <TextField
              label="OEL value"
              inputMode="decimal"
              error={errors.oelValue?.message}
              {...form.register('oelValue', { setValueAs: numberOrUndefined })}
            />
            <SelectField
              label="Unit"
              options={units.map((unit) => ({ value: unit, label: exposureUnitLabels[unit] }))}
              error={errors.oelUnit?.message}
              {...form.register('oelUnit')}
            />
            <TextField label="Source of the limit" autoComplete="off" error={errors.oelSource?.message} {...form.register('oelSource')} />
            <SelectField label="Averaging time" options={averagingOptions} error={errors.oelAveragingTime?.message} {...form.register('oelAveragingTime')} />
          </div>
        )}

        <div className="grid gap-3 md:grid-cols-3">
          <TextField
            label={`Action level (${oelUnitLabel})`}
            inputMode="decimal"
            hint={kind === 'noise' ? 'The hearing conservation trigger; below the OEL.' : 'Optional; below the OEL (often half of it).'}
            error={errors.actionLevel?.message}
            {...form.register('actionLevel', { setValueAs: numberOrNull })}
          />
          <TextField
            label="Shift length (hours)"
            inputMode="decimal"
            hint="The usual full shift of the group."
            error={errors.shiftHours?.message}
            {...form.register('shiftHours', { setValueAs: numberOrUndefined })}
          />
          {briefScalaAllowed && (
            <SelectField
              label="Extended-shift adjustment"
              options={[
                { value: 'none', label: 'None: judge against the OEL as set' },
                { value: 'brief-scala', label: 'Brief & Scala reduction for long shifts' },
              ]}
              error={errors.extendedShiftAdjustment?.message}
              {...form.register('extendedShiftAdjustment')}
            />
          )}
        </div>
        {briefScalaAllowed && form.watch('extendedShiftAdjustment') === 'brief-scala' && (
          <Notice tone="info">
            Brief & Scala (1975) lower an 8-hour limit for a longer shift by (8/h) × (24 − h)/16: more hours exposed and fewer hours to recover.
            {shiftHours > 8 && shiftHours <= 24
              ? ` For ${formatNumber(shiftHours)} h the factor is ${formatNumber(briefScalaReductionFactor(shiftHours), 4)}.`
              : ' For a shift of 8 hours or less the limit stays as it is.'}{' '}
            The model suits substances with cumulative effects, not irritants or short-term limits.
          </Notice>
        )}
      </fieldset>

      <FormActions error={formError} submitLabel={group ? 'Save group' : 'Create group'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
