import type { NoiseLogDetail } from '../api/types';
import { criteriaLabels, decibels, dose } from '../lib/format-noise';

const sets = ['oshaPel', 'oshaHc', 'nioshRel'] as const;

/**
 * As-logged vs reviewed figures per criteria set, with the action level (OSHA 29 CFR 1910.95(c):
 * 85 dBA TWA = 50 % dose on the hearing-conservation set) and the group's criteria set marked.
 */
export function NoiseFiguresTable({ log }: { log: NoiseLogDetail }) {
  const { asLogged, reviewed } = log.figures;
  const groupSet = log.group.noiseCriteriaSet;
  return (
    <div className="overflow-x-auto">
      <table className="min-w-full text-sm" aria-label="As-logged and reviewed figures">
        <thead>
          <tr className="border-b border-slate-300 text-left text-slate-600">
            <th scope="col" className="py-1.5 pr-4 font-medium">
              Criteria set
            </th>
            <th scope="col" className="py-1.5 pr-4 text-right font-medium">
              Dose as logged
            </th>
            <th scope="col" className="py-1.5 pr-4 text-right font-medium">
              Dose reviewed
            </th>
            <th scope="col" className="py-1.5 pr-4 text-right font-medium">
              TWA as logged
            </th>
            <th scope="col" className="py-1.5 pr-4 text-right font-medium">
              TWA reviewed
            </th>
          </tr>
        </thead>
        <tbody>
          {sets.map((set) => (
            <tr key={set} className={`border-b border-slate-200 ${groupSet === set ? 'bg-primary-50' : ''}`}>
              <th scope="row" className="py-1.5 pr-4 text-left font-normal">
                {criteriaLabels[set]}
                {groupSet === set && <span className="ml-2 text-xs font-semibold text-primary-800">(the group's set)</span>}
              </th>
              <td className="py-1.5 pr-4 text-right tabular-nums">{dose(asLogged[set].dose)}</td>
              <td className="py-1.5 pr-4 text-right font-semibold tabular-nums" data-testid={`reviewed-dose-${set}`}>
                {dose(reviewed[set].dose)}
              </td>
              <td className="py-1.5 pr-4 text-right tabular-nums">{decibels(asLogged[set].twa, 'dBA')}</td>
              <td className="py-1.5 pr-4 text-right tabular-nums">{decibels(reviewed[set].twa, 'dBA')}</td>
            </tr>
          ))}
          <tr className={`border-b border-slate-200 ${groupSet === 'iso' ? 'bg-primary-50' : ''}`}>
            <th scope="row" className="py-1.5 pr-4 text-left font-normal">
              ISO 9612 LAeq / LEX,8h
            </th>
            <td className="py-1.5 pr-4 text-right tabular-nums">{decibels(asLogged.iso.laeq, 'dBA')}</td>
            <td className="py-1.5 pr-4 text-right font-semibold tabular-nums">{decibels(reviewed.iso.laeq, 'dBA')}</td>
            <td className="py-1.5 pr-4 text-right tabular-nums">{decibels(asLogged.iso.lex8h, 'dBA')}</td>
            <td className="py-1.5 pr-4 text-right tabular-nums">{decibels(reviewed.iso.lex8h, 'dBA')}</td>
          </tr>
        </tbody>
      </table>
      <p className="mt-2 text-sm">
        <strong>Action level (hearing conservation trigger):</strong> 85 dBA TWA = 50 % dose on the OSHA hearing-conservation set (OSHA 29 CFR 1910.95(c)). As
        logged: {log.actionLevel.asLoggedReached ? 'reached' : 'not reached'}; reviewed:{' '}
        <strong>
          {log.actionLevel.reviewedReached === null ? 'no figure (everything masked)' : log.actionLevel.reviewedReached ? 'reached' : 'not reached'}
        </strong>
        .
      </p>
      <p className="mt-1 text-xs text-slate-600">
        LEX,8h uses Te = {log.exposureHours.toFixed(2)} h (
        {log.exposureHoursSource === 'file' ? 'shift hours from the file' : log.exposureHoursSource === 'option' ? 'shift hours given' : 'the run time'}).
        Reviewed figures give masked time the mean of the unmasked time. A 5 dB exchange rate or a threshold applied to interval levels only approximates a
        dosimeter's slow-weighted integration; the error grows with the interval ({log.intervalSeconds} s here). LAeq and LEX,8h are exact energy sums of the
        intervals (docs/decisions/004).
      </p>
    </div>
  );
}
