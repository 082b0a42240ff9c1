import type { ExposureUnit } from '@schema/agents';
import { formatFigure, formatShare, fullPrecision, unitLabel } from '../lib/format-figure';

/**
 * One number as people read it (3 significant figures, optionally with its unit or as a percentage),
 * with every digit in the tooltip.
 */
export function Figure({ value, unit, share = false }: { value: number | null | undefined; unit?: ExposureUnit; share?: boolean }) {
  const text = share ? formatShare(value) : formatFigure(value);
  const full = fullPrecision(value);
  return (
    <span className="tabular-nums" title={full === undefined ? undefined : share ? `${full} (as a share of 1)` : full}>
      {text}
      {unit && value !== null && value !== undefined && <> {unitLabel(unit)}</>}
    </span>
  );
}
