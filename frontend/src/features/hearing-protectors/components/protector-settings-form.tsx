import { protectorSettingsUpdate, type ProtectorSettingsValues } from '@schema/hearing-protectors';
import { NumberSettingsForm, type NumberSettingField } from '@frontend/components/number-settings-form';
import { useUpdateProtectorSettings } from '../api/hearing-protectors';

const fields: Array<NumberSettingField<keyof ProtectorSettingsValues>> = [
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
  return (
    <NumberSettingsForm
      fields={fields}
      values={values}
      schema={protectorSettingsUpdate}
      save={update.mutateAsync}
      pending={update.isPending}
      canManage={canManage}
      savedMessage="Saved. Verdicts use these thresholds from now on."
      readOnlyMessage="Only an admin can change these thresholds."
      submitLabel="Save thresholds"
      className="space-y-3"
      gridClassName="grid gap-3 sm:grid-cols-4"
    />
  );
}
