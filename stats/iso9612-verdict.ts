/**
 * Comparing an ISO 9612 LEX,8h and its expanded uncertainty U with the noise action and limit
 * values in force for an exposure group. ISO 9612:2009 (clause 12/15) reports LEX,8h with U; the
 * decision rule used here — compare LEX,8h + U, the one-sided 95 % upper bound, with each value —
 * is common practice for a conservative reading, and the sentence says so by naming LEX,8h + U.
 *
 * Which values apply follows the group's noise criteria set:
 * - 'iso' (or none): Directive 2003/10/EC Art. 3 — lower exposure action value 80 dB(A), upper
 *   exposure action value 85 dB(A), exposure limit value 87 dB(A). The limit value takes account of
 *   hearing protectors; this comparison is without them.
 * - 'oshaPel' / 'oshaHc': OSHA 29 CFR 1910.95 — action level 85 dBA 8-hour TWA (hearing
 *   conservation, (c)(1)) and PEL 90 dBA (Table G-16). OSHA's TWA uses a 5 dB exchange rate and
 *   LEX,8h an equal-energy 3 dB one, so for a varying level the comparison is indicative only.
 * - 'nioshRel': NIOSH REL 85 dBA, 3 dB exchange rate (Publ. 98-126): LEX,8h compares directly.
 * Plus the group's own OEL and action level when they are in dB(A), or in % dose under a 3 or
 * 5 dB criteria set (converted by L = Lc + q·log2(D/100), OSHA 1910.95 App. A form).
 */
import { nioshRel, oshaHc, oshaPel, type NoiseCriteriaSet } from './noise-criteria';

export type VerdictCriteriaSet = 'oshaPel' | 'oshaHc' | 'nioshRel' | 'iso';

/** A value an estimate is compared with, dB(A). */
export interface NoiseValueInForce {
  readonly kind: 'action' | 'limit';
  readonly label: string;
  readonly valueDb: number;
  readonly source: string;
  /** A caveat on the comparison, or null. */
  readonly note: string | null;
}

/** The group's own values as stored on the group. */
export interface VerdictGroup {
  readonly noiseCriteriaSet: VerdictCriteriaSet | null;
  readonly oelValue: number;
  readonly oelUnit: string;
  readonly oelSource: string;
  readonly actionLevel: number | null;
}

const exchangeNote = 'OSHA computes the TWA with a 5 dB exchange rate; LEX,8h uses 3 dB (equal energy), so for a varying level this comparison is indicative.';
const euLimitNote = 'The exposure limit value takes account of hearing protectors; this comparison is without them.';

const sets: Record<'oshaPel' | 'oshaHc' | 'nioshRel', NoiseCriteriaSet> = { oshaPel, oshaHc, nioshRel };

/** The criteria the values come from, for the "which set applies" line. */
export function verdictCriteria(set: VerdictCriteriaSet | null): { name: string; label: string } {
  if (set === 'oshaPel' || set === 'oshaHc') return { name: set, label: 'OSHA 29 CFR 1910.95 (action level 85 dBA, PEL 90 dBA)' };
  if (set === 'nioshRel') return { name: set, label: 'NIOSH REL (85 dBA, 3 dB exchange rate)' };
  return { name: 'eu-2003-10', label: 'Directive 2003/10/EC (action values 80 and 85 dB(A), limit value 87 dB(A))' };
}

/**
 * The action and limit values in force for a noise group, in dB(A), lowest first.
 * Sources as in the file comment (REFERENCES.md "Noise").
 */
export function noiseValuesInForce(group: VerdictGroup): NoiseValueInForce[] {
  const values: NoiseValueInForce[] = [];
  const set = group.noiseCriteriaSet;
  if (set === 'oshaPel' || set === 'oshaHc') {
    values.push(
      { kind: 'action', label: 'OSHA action level (hearing conservation)', valueDb: 85, source: 'OSHA 29 CFR 1910.95(c)(1)', note: exchangeNote },
      { kind: 'limit', label: 'OSHA permissible exposure limit', valueDb: 90, source: 'OSHA 29 CFR 1910.95(b), Table G-16', note: exchangeNote },
    );
  } else if (set === 'nioshRel') {
    values.push({
      kind: 'limit',
      label: 'NIOSH recommended exposure limit (hearing conservation trigger)',
      valueDb: 85,
      source: 'NIOSH Publ. 98-126 (1998), chapter 1',
      note: null,
    });
  } else {
    values.push(
      { kind: 'action', label: 'lower exposure action value', valueDb: 80, source: 'Directive 2003/10/EC Art. 3', note: null },
      { kind: 'action', label: 'upper exposure action value', valueDb: 85, source: 'Directive 2003/10/EC Art. 3', note: null },
      { kind: 'limit', label: 'exposure limit value', valueDb: 87, source: 'Directive 2003/10/EC Art. 3', note: euLimitNote },
    );
  }
  const own = (value: number | null, kind: 'action' | 'limit'): NoiseValueInForce | null => {
    if (value === null || !(value > 0) || !Number.isFinite(value)) return null;
    const what = kind === 'limit' ? 'group OEL' : 'group action level';
    if (group.oelUnit === 'dBA') return { kind, label: what, valueDb: value, source: group.oelSource, note: null };
    if (group.oelUnit === 'dose-percent' && set !== null && set !== 'iso') {
      const criteria = sets[set];
      const valueDb = criteria.criterionLevelDb + criteria.exchangeRateDb * Math.log2(value / 100);
      return {
        kind,
        label: `${what} (${Number(value.toPrecision(4))} % dose)`,
        valueDb,
        source: `${group.oelSource}; converted by ${criteria.label}`,
        note: criteria.exchangeRateDb === 3 ? null : exchangeNote,
      };
    }
    return null;
  };
  for (const value of [own(group.actionLevel, 'action'), own(group.oelValue, 'limit')]) {
    if (
      value &&
      !values.some((existing) => Math.abs(existing.valueDb - value.valueDb) < 1e-9 && existing.kind === value.kind && existing.label === value.label)
    )
      values.push(value);
  }
  return values.sort((a, b) => a.valueDb - b.valueDb);
}

/** One comparison, with the sentence the product shows. */
export interface NoiseComparison extends NoiseValueInForce {
  /** LEX,8h + U ≥ value. */
  readonly lexPlusUAbove: boolean;
  /** LEX,8h ≥ value. */
  readonly lexAbove: boolean;
  readonly sentence: string;
}

const oneDecimal = (value: number) => (Math.round(value * 10) / 10).toFixed(1);
const valueText = (value: number) => (Number.isInteger(value) ? String(value) : oneDecimal(value));

/**
 * Each value in force compared with LEX,8h + U ("at or above" counts, as 29 CFR 1910.95(c)(1)
 * "equal to or exceeding" and 2003/10/EC "reached or exceeded").
 * compareWithValues(86.5, 3.1, [upper 85]) → "LEX,8h + U = 89.6 dB(A) is above the upper exposure action value 85 dB(A)"
 */
export function compareWithValues(lex8h: number, expandedUncertainty: number, values: readonly NoiseValueInForce[]): NoiseComparison[] {
  if (!Number.isFinite(lex8h)) throw new RangeError(`compareWithValues: LEX,8h must be a finite number, got ${lex8h}`);
  if (!(expandedUncertainty >= 0) || !Number.isFinite(expandedUncertainty))
    throw new RangeError(`compareWithValues: U must be a finite number ≥ 0, got ${expandedUncertainty}`);
  const upper = lex8h + expandedUncertainty;
  return values.map((value) => {
    const lexPlusUAbove = upper >= value.valueDb;
    const relation = upper > value.valueDb ? 'is above' : upper === value.valueDb ? 'reaches' : 'is below';
    return {
      ...value,
      lexPlusUAbove,
      lexAbove: lex8h >= value.valueDb,
      sentence: `LEX,8h + U = ${oneDecimal(upper)} dB(A) ${relation} the ${value.label} ${valueText(value.valueDb)} dB(A)`,
    };
  });
}
