import { exposureUnitLabels, type ExposureUnit } from '@schema/agents';
import { formatNumber } from '@frontend/lib/format';

/**
 * A shift result as read: "0.412 mg/m³", or for a non-detect "< 0.02 mg/m³" (below the limit of
 * detection: the value stored is the limit, the true value lies under it).
 */
export function resultValueText(result: { value: number; unit: ExposureUnit; nonDetect: boolean }): string {
  return `${result.nonDetect ? '< ' : ''}${formatNumber(result.value, 4)} ${exposureUnitLabels[result.unit]}`;
}

export function ResultValue({ result }: { result: { value: number; unit: ExposureUnit; nonDetect: boolean } }) {
  return (
    <span className="font-medium whitespace-nowrap text-slate-900 tabular-nums" title={result.nonDetect ? 'Below the limit of detection (LOD)' : undefined}>
      {resultValueText(result)}
      {result.nonDetect && <span className="ml-1 rounded bg-slate-100 px-1 text-[11px] font-normal text-slate-600">LOD</span>}
    </span>
  );
}

export const sourceLabels = {
  entered: 'Entered',
  'lab-import': 'Lab import',
  'noise-log': 'Noise log',
  mixture: 'Mixture',
} as const;
