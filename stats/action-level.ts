import { nioshRel, oshaHc, oshaPel, type NoiseCriteriaSet } from './noise-criteria';

/**
 * Which shift results are at or above an exposure group's action level — the results that call
 * for a letter to the worker (docs/decisions/024-worker-letters.md).
 *
 * Where the action level comes from, in this order:
 * 1. The group's own action level (in the group's OEL unit), set by the hygienist from the rule
 *    that applies locally. It always wins.
 * 2. Noise without one: the hearing-conservation trigger of OSHA 29 CFR 1910.95(c)(1), an 8-hour
 *    TWA of 85 dBA — 85 dBA for results in dBA; for results in % dose, the dose that 85 dBA gives
 *    under the group's criteria set, D = 100·2^((85 − Lc)/q) (OSHA 1910.95 Appendix A formula):
 *    50 % for the OSHA sets (90 dBA, 5 dB), 100 % for the NIOSH set (85 dBA, 3 dB). A dose group
 *    judged with ISO 9612 has no dose scale, so it needs its own action level.
 * 3. A chemical (or mixture index) 8-hour TWA limit without one: half the OEL, the action level of the NIOSH
 *    Occupational Exposure Sampling Strategy Manual (Leidel, Busch & Lynch 1977, Publ. 77-173)
 *    (from memory). Short-term and ceiling limits get no default: the group needs its own.
 *
 * "At or above" is inclusive: 1910.95(c)(1) reads "equal to or exceeding". Non-detects are never
 * at or above (the true value lies below the detection limit), nor are void results, nor results
 * stored in another unit than the action level's (they cannot be compared without a conversion).
 */

/** A mixture (additive index, limit 1) is judged like a chemical. */
export type ActionLevelAgentKind = 'noise' | 'chemical' | 'mixture';
/** The group's OEL unit; noise uses 'dBA' or 'dose-percent'. Any other unit is compared as is. */
export type ActionLevelUnit = string;
export type ActionLevelCriteriaSet = 'oshaPel' | 'oshaHc' | 'nioshRel' | 'iso';
export type ActionLevelAveragingTime = '8h-twa' | '15min-stel' | 'ceiling';

/** What the rule needs to know about the group. */
export interface ActionLevelGroup {
  agentKind: ActionLevelAgentKind;
  oelValue: number;
  oelUnit: ActionLevelUnit;
  oelAveragingTime: ActionLevelAveragingTime;
  /** The group's own action level in `oelUnit`, or null. */
  actionLevel: number | null;
  noiseCriteriaSet: ActionLevelCriteriaSet | null;
}

/** Where the action level used came from. */
export type ActionLevelOrigin = 'group' | 'hearing-conservation-default' | 'half-oel-default';

export interface ResolvedActionLevel {
  value: number;
  unit: ActionLevelUnit;
  origin: ActionLevelOrigin;
  /** One sentence naming the source of the number (shown beside it and written into letters). */
  basis: string;
}

/** The 8-hour TWA that starts hearing conservation, OSHA 29 CFR 1910.95(c)(1), dBA. */
export const hearingConservationTwaDb = 85;

const criteriaSets: Record<'oshaPel' | 'oshaHc' | 'nioshRel', NoiseCriteriaSet> = { oshaPel, oshaHc, nioshRel };

/**
 * The action level a group's results are compared with, or null when none can be set without the
 * hygienist (a % dose group judged with ISO 9612; a short-term or ceiling chemical limit).
 * resolveActionLevel({ agentKind: 'noise', oelUnit: 'dBA', actionLevel: null, … }).value → 85
 */
export function resolveActionLevel(group: ActionLevelGroup): ResolvedActionLevel | null {
  if (group.actionLevel !== null) {
    if (!(group.actionLevel > 0) || !Number.isFinite(group.actionLevel))
      throw new RangeError(`resolveActionLevel: the group's action level must be a finite number > 0, got ${group.actionLevel}`);
    return {
      value: group.actionLevel,
      unit: group.oelUnit,
      origin: 'group',
      basis: 'The action level set on this exposure group, from the rule that applies.',
    };
  }
  if (group.agentKind === 'noise') {
    if (group.oelUnit === 'dBA') {
      return {
        value: hearingConservationTwaDb,
        unit: 'dBA',
        origin: 'hearing-conservation-default',
        basis: 'No action level is set on the group: the hearing conservation trigger of OSHA 29 CFR 1910.95(c)(1), an 8-hour TWA of 85 dB(A), is used.',
      };
    }
    if (group.oelUnit === 'dose-percent' && group.noiseCriteriaSet !== null && group.noiseCriteriaSet !== 'iso') {
      const criteria = criteriaSets[group.noiseCriteriaSet];
      // The exchange-rate form gives exactly 50 % for the OSHA sets; the 16.61-slope TWA
      // formula (doseFromTwa) gives 49.99…, which would let 49.995 % count as "at or above".
      const dose = 100 * Math.pow(2, (hearingConservationTwaDb - criteria.criterionLevelDb) / criteria.exchangeRateDb);
      return {
        value: dose,
        unit: 'dose-percent',
        origin: 'hearing-conservation-default',
        basis: `No action level is set on the group: the hearing conservation trigger of OSHA 29 CFR 1910.95(c)(1), an 8-hour TWA of 85 dB(A), is used; under ${criteria.label} that is a dose of ${formatPercent(dose)} %.`,
      };
    }
    return null;
  }
  if (group.oelAveragingTime !== '8h-twa') return null;
  if (!(group.oelValue > 0) || !Number.isFinite(group.oelValue))
    throw new RangeError(`resolveActionLevel: the OEL must be a finite number > 0, got ${group.oelValue}`);
  return {
    value: group.oelValue / 2,
    unit: group.oelUnit,
    origin: 'half-oel-default',
    basis: 'No action level is set on the group: half the OEL is used, the action level of the NIOSH Occupational Exposure Sampling Strategy Manual (1977).',
  };
}

function formatPercent(value: number): string {
  return Number.isInteger(value) ? String(value) : value.toPrecision(3);
}

/** One shift result as the rule sees it. */
export interface ActionLevelResult {
  value: number;
  unit: ActionLevelUnit;
  nonDetect: boolean;
  status: 'valid' | 'void';
}

/**
 * Whether one result is at or above the action level: valid, detected, in the action level's
 * unit, and value ≥ level (inclusive, 29 CFR 1910.95(c)(1) "equal to or exceeding").
 * isAtOrAboveActionLevel({ value: 85, unit: 'dBA', nonDetect: false, status: 'valid' }, level85) → true
 */
export function isAtOrAboveActionLevel(result: ActionLevelResult, level: ResolvedActionLevel): boolean {
  if (!Number.isFinite(result.value)) throw new RangeError(`isAtOrAboveActionLevel: the result value must be a finite number, got ${result.value}`);
  if (result.status !== 'valid' || result.nonDetect || result.unit !== level.unit) return false;
  return result.value >= level.value;
}

/** The results (in their order) at or above the action level. */
export function resultsAtOrAboveActionLevel<Result extends ActionLevelResult>(results: readonly Result[], level: ResolvedActionLevel): Result[] {
  return results.filter((result) => isAtOrAboveActionLevel(result, level));
}
