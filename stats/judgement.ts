import type { Judgement } from './types';

/**
 * The classical judgement of an exposure group from its 95th percentile. The AIHA strategy
 * (A Strategy for Assessing and Managing Occupational Exposures, 3rd ed. 2006; REFERENCES.md)
 * judges a group on whether the 95th percentile of its exposure distribution lies below the OEL
 * and uses the upper tolerance limit UTL95%,95% for 95 % confidence (from memory). The three rules
 * below are Bellwether's reading of that logic (docs/decisions/001-classical-statistics-methods.md).
 */

/** The rules, word for word as applied; shown beside every judgement. */
export const CLASSICAL_JUDGEMENT_RULES = Object.freeze({
  unacceptable: 'Unacceptable when the point estimate of the 95th percentile is above the OEL.',
  acceptable: 'Acceptable when the upper tolerance limit UTL95%,95% (the upper 95 % confidence limit of the 95th percentile) is at or below the OEL.',
  uncertain: 'Uncertain otherwise (95th percentile estimate at or below the OEL, UTL95%,95% above it): more shift results are needed.',
  order: 'The unacceptable rule is checked first, so that inconsistent limits can never give a milder judgement.',
});

export interface ClassicalJudgementInput {
  /** Point estimate of the 95th percentile. */
  p95: number;
  /** Upper tolerance limit UTL95%,95%. */
  utl95_95: number;
  /** The occupational exposure limit, in the same unit. */
  oel: number;
}

/**
 * acceptable / uncertain / unacceptable by CLASSICAL_JUDGEMENT_RULES.
 * classicalJudgement({ p95: 0.4, utl95_95: 0.9, oel: 1 }) → 'acceptable'
 */
export function classicalJudgement({ p95, utl95_95, oel }: ClassicalJudgementInput): Judgement {
  for (const [name, value] of [
    ['p95', p95],
    ['utl95_95', utl95_95],
    ['oel', oel],
  ] as const) {
    if (!(value > 0) || !Number.isFinite(value)) {
      throw new RangeError(`classicalJudgement: ${name} must be a finite number > 0, got ${value}`);
    }
  }
  if (p95 > oel) return 'unacceptable';
  if (utl95_95 <= oel) return 'acceptable';
  return 'uncertain';
}

/** One plain-language sentence for a manager explaining the judgement. */
export function judgementSentence(judgement: Judgement): string {
  switch (judgement) {
    case 'acceptable':
      return 'Exposures in this group are well controlled: we are 95 % confident that fewer than 5 % of shifts exceed the limit.';
    case 'unacceptable':
      return 'Exposures in this group are too high: our best estimate is that more than 5 % of shifts exceed the limit, so controls must be improved.';
    case 'uncertain':
      return 'We cannot yet say whether exposures in this group are under control: the best estimate is within the limit, but more than 5 % of shifts exceeding it cannot be ruled out, so more shift measurements are needed.';
  }
}
