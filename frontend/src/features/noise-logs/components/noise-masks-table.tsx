import { Button } from '@frontend/components/button';
import type { NoiseMaskView } from '../api/types';
import { clockTime, duration, signed } from '../lib/format-noise';

/** Masks in use with what each alone changes; extend, shorten or remove with a reason. */
export function NoiseMasksTable({
  masks,
  criteriaSet,
  canEdit,
  onEdit,
  onRemove,
}: {
  masks: NoiseMaskView[];
  criteriaSet: 'oshaPel' | 'oshaHc' | 'nioshRel';
  canEdit: boolean;
  onEdit: (mask: NoiseMaskView) => void;
  onRemove: (mask: NoiseMaskView) => void;
}) {
  if (masks.length === 0) return <p className="text-sm text-slate-600">No masked spans: the reviewed figures equal the as-logged ones.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-sm" aria-label="Masked spans">
        <thead>
          <tr className="border-b border-slate-300 text-left text-slate-600">
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Start
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              End
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Masked
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Reason
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Origin
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Author
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              Dose change alone
            </th>
            {canEdit && (
              <th scope="col" className="py-1.5 font-medium">
                <span className="sr-only">Actions</span>
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {masks.map((mask) => (
            <tr key={mask.id} className="border-b border-slate-200">
              <td className="py-1.5 pr-3 tabular-nums">{clockTime(mask.startS)}</td>
              <td className="py-1.5 pr-3 tabular-nums">{clockTime(mask.endS)}</td>
              <td className="py-1.5 pr-3 tabular-nums">{duration(mask.effect.maskedSeconds)}</td>
              <td className="py-1.5 pr-3">{mask.reason}</td>
              <td className="py-1.5 pr-3">{mask.origin === 'proposed' ? 'Proposed (knock)' : 'Reviewer'}</td>
              <td className="py-1.5 pr-3">{mask.author ?? 'Wear check'}</td>
              <td className="py-1.5 pr-3 text-right tabular-nums">{signed(mask.effect.doseChange[criteriaSet], 'pp', 2)}</td>
              {canEdit && (
                <td className="py-1.5 whitespace-nowrap">
                  <Button size="sm" onClick={() => onEdit(mask)} aria-label={`Change the mask from ${clockTime(mask.startS)}`}>
                    Change
                  </Button>{' '}
                  <Button size="sm" variant="danger" onClick={() => onRemove(mask)} aria-label={`Remove the mask from ${clockTime(mask.startS)}`}>
                    Remove
                  </Button>
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-slate-600">
        Dose change in percentage points of the group's criteria set, for each mask on its own. Removed masks stay in the audit trail.
      </p>
    </div>
  );
}
