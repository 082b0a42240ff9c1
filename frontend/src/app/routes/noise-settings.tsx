import { noiseSettingsUpdate, type NoiseSettingsValues } from '@schema/noise-logs';
import { can } from '@schema/permissions';
import { DocumentTitle } from '@frontend/components/document-title';
import { NumberSettingsForm, type NumberSettingField } from '@frontend/components/number-settings-form';
import { PageHeader } from '@frontend/components/page-header';
import { QueryState } from '@frontend/components/query-state';
import { useNoiseSettings, useUpdateNoiseSettings } from '@frontend/features/noise-logs/api/noise-settings';
import { useMembership } from '../use-membership';

const fields: Array<NumberSettingField<keyof NoiseSettingsValues>> = [
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
  return (
    <NumberSettingsForm
      fields={fields}
      values={values}
      schema={noiseSettingsUpdate}
      save={update.mutateAsync}
      pending={update.isPending}
      saveError={update.error}
      canManage={canManage}
      savedMessage="Saved. Logs uploaded from now on use these settings."
      readOnlyMessage="Only an admin can change these settings."
      submitLabel="Save settings"
      className="max-w-2xl space-y-4"
      gridClassName="grid gap-3 sm:grid-cols-2"
    />
  );
}
