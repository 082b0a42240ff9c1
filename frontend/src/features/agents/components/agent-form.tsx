import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { agentCreate, type AgentCreate } from '@schema/agents';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { applyServerErrorsInline } from '@frontend/lib/form-errors';
import { useCreateAgent } from '../api/create-agent';
import type { AgentView } from '../api/get-agents';
import { useUpdateAgent } from '../api/update-agent';

const kindOptions = [
  { value: 'chemical', label: 'Chemical (concentration)' },
  { value: 'noise', label: 'Noise' },
];

/** Empty text → null, for optional fields the API stores as null. */
const emptyToNull = (value: unknown) => (value === '' || value === undefined ? null : value);
const numberOrNull = (value: unknown) => (value === '' || value === null || value === undefined ? null : Number(value));

/**
 * Add or edit an agent. A chemical may carry its CAS number (check digit verified) and molecular
 * weight, which converts ppm ↔ mg/m³; noise carries neither, so those fields hide for noise.
 */
export function AgentForm({
  organizationId,
  agent,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  agent?: AgentView;
  onSaved: (agent: AgentView) => void;
  onCancel: () => void;
}) {
  const create = useCreateAgent(organizationId);
  const update = useUpdateAgent(organizationId);
  const form = useForm({
    resolver: zodResolver(agentCreate),
    defaultValues: {
      name: agent?.name ?? '',
      kind: agent?.kind ?? 'chemical',
      casNumber: agent?.casNumber ?? null,
      molecularWeight: agent?.molecularWeight ?? null,
      notes: agent?.notes ?? '',
    },
  });
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, isSubmitting } = form.formState;
  const kind = form.watch('kind');

  const submit = form.handleSubmit(async (values: AgentCreate) => {
    setFormError(null);
    try {
      onSaved(agent ? await update.mutateAsync({ agentId: agent.id, changes: values }) : await create.mutateAsync(values));
    } catch (error) {
      setFormError(applyServerErrorsInline(error, form.setError, ['name', 'kind', 'casNumber', 'molecularWeight', 'notes']));
    }
  });

  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-[1fr_14rem]">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
        <SelectField
          label="Kind"
          options={kindOptions}
          error={errors.kind?.message}
          {...form.register('kind', {
            // Noise has no CAS number or molecular weight: clear the hidden fields.
            onChange: (event) => {
              if (event.target.value === 'noise') {
                form.setValue('casNumber', null);
                form.setValue('molecularWeight', null);
              }
            },
          })}
        />
      </div>
      {kind === 'chemical' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField
            label="CAS number"
            hint="Optional, e.g. 14808-60-7. Mixtures such as wood dust have none."
            autoComplete="off"
            error={errors.casNumber?.message}
            {...form.register('casNumber', { setValueAs: emptyToNull })}
          />
          <TextField
            label="Molecular weight (g/mol)"
            hint="Needed to convert between ppm and mg/m³ (at 25 °C)."
            inputMode="decimal"
            error={errors.molecularWeight?.message}
            {...form.register('molecularWeight', { setValueAs: numberOrNull })}
          />
        </div>
      )}
      <TextAreaField label="Notes" error={errors.notes?.message} {...form.register('notes')} />
      <FormActions error={formError} submitLabel={agent ? 'Save agent' : 'Add agent'} pending={isSubmitting} onCancel={onCancel} />
    </form>
  );
}
