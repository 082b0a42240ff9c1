import { useState, type FormEvent } from 'react';
import { hearingProtectorCreate, hearingProtectorTypeLabels, hearingProtectorTypes } from '@schema/hearing-protectors';
import { FormActions } from '@frontend/components/form-actions';
import { SelectField, TextAreaField, TextField } from '@frontend/components/form-field';
import { isApiError } from '@frontend/lib/api-client';
import type { HearingProtectorView } from '@schema/hearing-protectors';
import { useCreateHearingProtector } from '../api/hearing-protectors';

const ratingFields = [
  { key: 'nrr', label: 'NRR, dB', hint: 'US Noise Reduction Rating, 0–45.' },
  { key: 'snr', label: 'SNR, dB', hint: 'Single Number Rating (EN ISO 4869-2), 0–50.' },
  { key: 'h', label: 'H, dB', hint: 'High-frequency value, 0–50.' },
  { key: 'm', label: 'M, dB', hint: 'Mid-frequency value, 0–50.' },
  { key: 'l', label: 'L, dB', hint: 'Low-frequency value, 0–50.' },
] as const;

/** Add a protector: free-text name, type and its ratings as printed on the data sheet. */
export function ProtectorForm({
  organizationId,
  onSaved,
  onCancel,
}: {
  organizationId: string;
  onSaved: (protector: HearingProtectorView) => void;
  onCancel: () => void;
}) {
  const create = useCreateHearingProtector(organizationId);
  const [draft, setDraft] = useState<Record<string, string>>({ name: '', type: 'earmuff', notes: '' });
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setFormError(null);
    const number = (key: string) => (draft[key]?.trim() ? Number(draft[key]!.replace(',', '.')) : null);
    const candidate = {
      name: draft.name ?? '',
      type: draft.type,
      notes: draft.notes ?? '',
      nrr: number('nrr'),
      snr: number('snr'),
      h: number('h'),
      m: number('m'),
      l: number('l'),
    };
    const parsed = hearingProtectorCreate.safeParse(candidate);
    if (!parsed.success) {
      setProblems(Object.fromEntries(parsed.error.issues.map((issue) => [String(issue.path[0]), issue.message])));
      return;
    }
    setProblems({});
    try {
      onSaved(await create.mutateAsync(parsed.data));
    } catch (failure) {
      if (isApiError(failure) && failure.fields) setProblems(failure.fields);
      else setFormError(isApiError(failure) ? failure.message : 'The protector could not be saved.');
    }
  }

  const set = (key: string) => (event: { target: { value: string } }) => setDraft({ ...draft, [key]: event.target.value });
  return (
    <form noValidate onSubmit={submit} className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-[1fr_16rem]">
        <TextField label="Name" hint="What people call it on site." autoComplete="off" value={draft.name} onChange={set('name')} error={problems.name} />
        <SelectField
          label="Type"
          options={hearingProtectorTypes.map((type) => ({ value: type, label: hearingProtectorTypeLabels[type] }))}
          value={draft.type}
          onChange={set('type')}
          error={problems.type}
        />
      </div>
      <div className="grid gap-3 sm:grid-cols-5">
        {ratingFields.map((field) => (
          <TextField
            key={field.key}
            label={field.label}
            hint={field.hint}
            inputMode="decimal"
            value={draft[field.key] ?? ''}
            onChange={set(field.key)}
            error={problems[field.key]}
          />
        ))}
      </div>
      <TextAreaField label="Notes" value={draft.notes} onChange={set('notes')} error={problems.notes} />
      <FormActions error={formError} submitLabel="Add protector" pending={create.isPending} onCancel={onCancel} />
    </form>
  );
}
