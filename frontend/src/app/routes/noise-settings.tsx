import { useState, type FormEvent } from 'react';
import { noiseSettingsUpdate, type NoiseSettingsValues } from '@schema/noise-logs';
import { can } from '@schema/permissions';
import { Button } from '@frontend/components/button';
import { DocumentTitle } from '@frontend/components/document-title';
import { TextField } from '@frontend/components/form-field';
import { Notice } from '@frontend/components/notice';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useNoiseSettings, useUpdateNoiseSettings } from '@frontend/features/noise-logs/api/noise-settings';
import { isApiError } from '@frontend/lib/api-client';
import { useMembership } from '../use-membership';

const fields: Array<{ key: keyof NoiseSettingsValues; label: string; hint: string }> = [
  { key: 'stillMinutes', label: 'Still stretch, minutes', hint: 'A run of intervals without motion at least this long is a still stretch (default 15).' },
  {
    key: 'motionChangeMg',
    label: 'Motion threshold, mg',
    hint: 'Without a motion column, a change of the mean acceleration of at least this counts as motion (default 30).',
  },
  { key: 'knockMg', label: 'Knock threshold, mg', hint: 'An interval whose peak acceleration reaches this is a knock (default 3000).' },
  { key: 'maskBeforeS', label: 'Knock mask before, s', hint: 'A knock’s proposed mask starts this long before the knock interval (default 2).' },
  { key: 'maskAfterS', label: 'Knock mask after, s', hint: 'A knock’s proposed mask ends this long after the knock interval (default 3).' },
  {
    key: 'driftLimitDb',
    label: 'Calibration drift limit, dB',
    hint: 'Flag a log whose calibration check drifts by more than this (default 0.5, common practice).',
  },
];

/** /orgs/:orgId/noise-settings — wear-check, mask and calibration settings; admins change them. */
export function Component() {
  const membership = useMembership();
  const settings = useNoiseSettings(membership.organizationKey);
  return (
    <>
      <DocumentTitle title={`Noise settings · ${membership.organizationName}`} />
      <PageHeader
        eyebrow={membership.organizationName}
        title="Noise log settings"
        description="Used for logs uploaded from now on; each log keeps the settings it was checked with."
      />
      <QueryState query={settings} loading="Loading the settings…" errorTitle="The settings could not be loaded">
        {(values) => (
          <SettingsForm
            key={membership.organizationKey}
            values={values}
            organizationId={membership.organizationKey}
            canManage={can(membership.role, 'settings:manage')}
          />
        )}
      </QueryState>
    </>
  );
}

function SettingsForm({ values, organizationId, canManage }: { values: NoiseSettingsValues; organizationId: string; canManage: boolean }) {
  const update = useUpdateNoiseSettings(organizationId);
  const [draft, setDraft] = useState<Record<string, string>>(() => Object.fromEntries(Object.entries(values).map(([key, value]) => [key, String(value)])));
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState(false);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(false);
    const parsed = noiseSettingsUpdate.safeParse(
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
    <form onSubmit={submit} className="max-w-2xl space-y-4" noValidate>
      {saved && <Notice tone="success">Saved. Logs uploaded from now on use these settings.</Notice>}
      {update.error && <Notice tone="error">{isApiError(update.error) ? update.error.message : 'The settings could not be saved.'}</Notice>}
      {!canManage && <Notice tone="info">Only an admin can change these settings.</Notice>}
      <div className="grid gap-3 sm:grid-cols-2">
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
          Save settings
        </Button>
      )}
    </form>
  );
}
