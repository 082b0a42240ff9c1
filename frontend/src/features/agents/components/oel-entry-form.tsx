import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { averagingTimeLabels, averagingTimes, exposureUnitLabels, oelEntryCreate, unitsForAgentKind, type OelEntryCreate } from '@schema/agents';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { useCreateOelEntry } from '../api/create-oel-entry';
import type { AgentView } from '../api/get-agents';
import type { OelEntryView } from '../api/get-oel-entries';
import { useUpdateOelEntry } from '../api/update-oel-entry';

const averagingOptions = averagingTimes.map((value) => ({ value, label: averagingTimeLabels[value] }));
const numberOrUndefined = (value: unknown) => (value === '' || value === null || value === undefined ? undefined : Number(value));

/**
 * Add or edit one line of the OEL list. The units offered follow the agent's kind (noise in dB(A)
 * or % dose, chemicals as concentrations). Groups copy a limit when they take it, so editing a
 * line here never changes what an existing group is judged against.
 */
export function OelEntryForm({
  organizationId,
  agents,
  entry,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  agents: readonly AgentView[];
  entry?: OelEntryView;
  onSaved: (entry: OelEntryView) => void;
  onCancel: () => void;
}) {
  const create = useCreateOelEntry(organizationId);
  const update = useUpdateOelEntry(organizationId);
  const firstAgent = agents[0];
  const form = useForm<z.input<typeof oelEntryCreate>, unknown, OelEntryCreate>({
    resolver: zodResolver(oelEntryCreate),
    defaultValues: {
      agentId: entry?.agentId ?? firstAgent?.id,
      source: entry?.source ?? '',
      value: entry?.value,
      unit: entry?.unit ?? (firstAgent ? unitsForAgentKind[firstAgent.kind][0] : 'mg/m3'),
      averagingTime: entry?.averagingTime ?? '8h-twa',
      notes: entry?.notes ?? '',
    },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;
  const agentId = form.watch('agentId');
  const kind = agents.find((agent) => agent.id === Number(agentId))?.kind ?? entry?.agentKind ?? 'chemical';
  const unitOptions = unitsForAgentKind[kind].map((value) => ({ value, label: exposureUnitLabels[value] }));

  const submit = form.handleSubmit(async (values: OelEntryCreate) => {
    setFormError(null);
    try {
      onSaved(entry ? await update.mutateAsync({ entryId: entry.id, changes: values }) : await create.mutateAsync(values));
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['agentId', 'source', 'value', 'unit', 'averagingTime', 'notes']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <SelectField
        label="Agent"
        options={[
          ...agents.map((agent) => ({ value: String(agent.id), label: agent.name })),
          // An entry of an archived agent keeps its agent in the list while it is edited.
          ...(entry && !agents.some((agent) => agent.id === entry.agentId) ? [{ value: String(entry.agentId), label: `${entry.agentName} (archived)` }] : []),
        ]}
        error={errors.agentId?.message}
        {...form.register('agentId', {
          setValueAs: numberOrUndefined,
          onChange: (event) => {
            const next = agents.find((agent) => agent.id === Number(event.target.value));
            if (next && !unitsForAgentKind[next.kind].includes(form.getValues('unit'))) form.setValue('unit', unitsForAgentKind[next.kind][0]);
          },
        })}
      />
      <TextField
        label="Source"
        hint="Where the limit comes from: a regulation, a recommended limit, an in-house limit."
        autoComplete="off"
        error={errors.source?.message}
        {...form.register('source')}
      />
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="Value" inputMode="decimal" error={errors.value?.message} {...form.register('value', { setValueAs: numberOrUndefined })} />
        <SelectField label="Unit" options={unitOptions} error={errors.unit?.message} {...form.register('unit')} />
        <SelectField label="Averaging time" options={averagingOptions} error={errors.averagingTime?.message} {...form.register('averagingTime')} />
      </div>
      <TextAreaField label="Notes" rows={2} error={errors.notes?.message} {...form.register('notes')} />
      <FormActions error={formError} submitLabel={entry ? 'Save limit' : 'Add limit'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
