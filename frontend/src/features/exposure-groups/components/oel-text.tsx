import { averagingTimeLabels, exposureUnitLabels, type AveragingTime, type ExposureUnit } from '@schema/agents';
import type { EffectiveOel } from '@frontend/lib/api-types';
import { formatNumber } from '@frontend/lib/format';

/** "5 mg/m³" — a limit with its unit. */
export function limitText(value: number, unit: ExposureUnit): string {
  return `${formatNumber(value, 6)} ${exposureUnitLabels[unit]}`;
}

/** The group's limit as judged: the effective OEL, and the set value when an adjustment lowers it. */
export function OelText({ effective, averagingTime }: { effective: EffectiveOel; averagingTime?: AveragingTime }) {
  const adjusted = effective.reductionFactor !== 1;
  return (
    <span className="whitespace-nowrap tabular-nums" title={effective.statement}>
      <span className="font-medium text-slate-900">{limitText(effective.value, effective.unit)}</span>
      {averagingTime && <span className="text-slate-600"> · {averagingTimeLabels[averagingTime]}</span>}
      {adjusted && <span className="text-slate-600"> (set {formatNumber(effective.baseValue, 6)}, long-shift adjusted)</span>}
    </span>
  );
}
