import { hearingProtectorTypeLabels } from '@schema/hearing-protectors';
import { ArchiveToggle } from '@frontend/components/archive-toggle';
import type { HearingProtectorView } from '@schema/hearing-protectors';
import { useArchiveHearingProtector } from '../api/hearing-protectors';

const rating = (value: number | null) => (value === null ? '—' : String(value));

/** The organization's protectors with their ratings and any rating warning. */
export function ProtectorsTable({
  organizationId,
  protectors,
  canEdit,
  onOutcome,
}: {
  organizationId: string;
  protectors: HearingProtectorView[];
  canEdit: boolean;
  onOutcome: (message: string) => void;
}) {
  const archive = useArchiveHearingProtector(organizationId);
  if (protectors.length === 0)
    return <p className="text-sm text-slate-600">No hearing protectors yet. Add the ones your people wear, with the ratings from their data sheets.</p>;
  return (
    <div className="card overflow-x-auto">
      <table className="table-dense w-full">
        <caption className="sr-only">Hearing protectors</caption>
        <thead>
          <tr>
            <th scope="col">Name</th>
            <th scope="col">Type</th>
            <th scope="col">NRR</th>
            <th scope="col">SNR</th>
            <th scope="col">H / M / L</th>
            <th scope="col">Groups</th>
            <th scope="col">Notes</th>
            {canEdit && (
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {protectors.map((protector) => (
            <tr key={protector.id} className={protector.archived ? 'text-slate-500' : undefined}>
              <td className="font-medium">
                {protector.name}
                {protector.archived && <span className="ml-1 text-xs">(archived)</span>}
                {protector.warnings.map((warning) => (
                  <p key={warning} className="text-xs font-normal text-amber-900">
                    {warning}
                  </p>
                ))}
              </td>
              <td>{hearingProtectorTypeLabels[protector.type]}</td>
              <td>{rating(protector.nrr)}</td>
              <td>{rating(protector.snr)}</td>
              <td>{protector.h === null ? '—' : `${protector.h} / ${protector.m} / ${protector.l}`}</td>
              <td>{protector.groupCount}</td>
              <td className="max-w-64 text-xs text-slate-600">{protector.notes}</td>
              {canEdit && (
                <td>
                  <ArchiveToggle
                    archived={protector.archived}
                    name={protector.name}
                    what="hearing protector"
                    consequence="It leaves the pick lists; groups that use it keep it until you take it off."
                    onChange={(archived, reason) => archive.mutateAsync({ protectorId: protector.id, archived, reason })}
                    onDone={onOutcome}
                  />
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
