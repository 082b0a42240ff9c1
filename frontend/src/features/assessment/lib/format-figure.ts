import { exposureUnitLabels, type ExposureUnit } from '@schema/agents';

/*
 * Figures are shown rounded for reading (3 significant figures) with the full value in a tooltip
 * (see components/figure.tsx); the API keeps full precision.
 */

const significant = new Intl.NumberFormat('en-GB', { maximumSignificantDigits: 3 });
const whole = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** 3 significant figures: 0.00412, 1.23, 12,300; "—" for null. */
export function formatFigure(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return significant.format(value);
}

/** A share 0–1 as a percentage with 3 significant figures: 0.0123 → "1.23 %". */
export function formatShare(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0 %';
  if (value === 1) return '100 %';
  // Below 0.001 % the digits say nothing a reader can use (the tooltip keeps them).
  if (value < 1e-5) return '< 0.001 %';
  return `${significant.format(value * 100)} %`;
}

/** A probability for a sentence: whole percent, but "< 1 %" / "> 99 %" rather than a misleading 0 or 100. */
export function formatProbability(value: number): string {
  if (value > 0 && value < 0.005) return '< 1 %';
  if (value < 1 && value > 0.995) return '> 99 %';
  return `${whole.format(value * 100)} %`;
}

/** The unit as people write it: "mg/m³", "% dose". */
export function unitLabel(unit: ExposureUnit): string {
  return exposureUnitLabels[unit];
}

/** "0.35 mg/m³", "82.3 % dose". */
export function formatWithUnit(value: number | null | undefined, unit: ExposureUnit): string {
  return `${formatFigure(value)} ${unitLabel(unit)}`;
}

/** The full value for a tooltip: every digit JavaScript keeps. */
export function fullPrecision(value: number | null | undefined): string | undefined {
  return value === null || value === undefined ? undefined : String(value);
}
