import { useState, type FormEvent } from 'react';
import { protectorSettingsUpdate, type ProtectorSettingsValues } from '@schema/hearing-protectors';
import { Button } from '@frontend/components/button';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { isApiError } from '@frontend/lib/api-client';
import { useUpdateProtectorSettings } from '../api/hearing-protectors';

const fields: Array<{ key: keyof ProtectorSettingsValues; label: string; hint: string }> = [
  {
    key: 'protectorActionLevelDb',
    label: 'Action level Lact, dB(A)',
    hint: 'Default 85: the upper exposure action value of Directive 2003/10/EC and NIOSH’s REL. Use the level your regulation sets.',
  },
  { key: 'protectorAcceptableMarginDb', label: 'Acceptable within, dB', hint: 'Lact − this … Lact is acceptable (EN 458, default 5).' },
  { key: 'protectorGoodMarginDb', label: 'Good within, dB', hint: 'Lact − this … Lact − the acceptable margin is good (EN 458, default 10).' },
  {
    key: 'protectorOverProtectionMarginDb',
    label: 'Over-protection below, dB',
    hint: 'Below Lact − this the protection is too high: warnings may go unheard (EN 458, default 15).',
  },
];

/** The verdict thresholds; an admin changes them, everyone else reads them. */
export function ProtectorSettingsForm({ organizationId, values, canManage }: { organizationId: string; values: ProtectorSettingsValues; canManage: boolean }) {
  const update = useUpdateProtectorSettings(organizationId);
  const [draft, setDraft] = useState<Record<string, string>>(() => Object.fromEntries(Object.entries(values).map(([key, value]) => [key, String(value)])));
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const parsed = protectorSettingsUpdate.safeParse(
      Object.fromEntries(Object.entries(draft).map(([key, value]) => [key, value.trim() === '' ? undefined : Number(value)])),
    );
    if (!parsed.success) {
      setProblems(Object.fromEntries(parsed.error.issues.map((issue) => [String(issue.path[0]), issue.message])));
      return;
    }
    setProblems({});
    try {
      await update.mutateAsync(parsed.data);
      setSaved(true);
    } catch (failure) {
      if (isApiError(failure) && failure.fields) setProblems(failure.fields);
    }
  }

  return (
    <form onSubmit={submit} className="space-y-3" noValidate>
      {saved && <Notice tone="success">Saved. Verdicts use these thresholds from now on.</Notice>}
      {!canManage && <Notice tone="info">Only an admin can change these thresholds.</Notice>}
      <div className="grid gap-3 sm:grid-cols-4">
        {fields.map((field) => (
          <TextField
            key={field.key}
            label={field.label}
            hint={field.hint}
            inputMode="decimal"
            value={draft[field.key] ?? ''}
            disabled={!canManage}
            onChange={(event) => setDraft({ ...draft, [field.key]: event.target.value })}
            error={problems[field.key]}
          />
        ))}
      </div>
      {canManage && (
        <Button type="submit" variant="primary" pending={update.isPending}>
          Save thresholds
        </Button>
      )}
    </form>
  );
}
