/**
 * Shared pieces of the ISO 9612:2009 measurement strategies (task-based, job-based, full-day):
 * the instrument and microphone-position uncertainties, the coverage factor, the sampling
 * contribution c1·u1 of the job-based and full-day strategies, and the job-based minimum
 * cumulative measurement duration (Table 1).
 *
 * Sources: ISO 9612:2009 "Acoustics — Determination of occupational noise exposure — Engineering
 * method", clause 10 (Table 1), Annex C (Tables C.4 and C.5, equations C.3–C.8), as listed in
 * REFERENCES.md ("ISO 9612:2009"). The printed values of Table C.4 were NOT available to us:
 * c1·u1 is computed (see {@link samplingContribution}) and checked against the expanded
 * uncertainties printed in Annexes E and F (tests/reference/iso9612.test.ts).
 */
import { landFactor } from './arithmetic-mean';
import { energyMeanLevel } from './noise-criteria';

/** Reference duration T0 of LEX,8h, hours (ISO 9612:2009, 3.x: T0 = 8 h). */
export const referenceHours = 8;

/** Coverage factor for a one-sided 95 % coverage interval: U = 1.65·u (ISO 9612:2009, C.1 and 12). */
export const coverageFactor = 1.65;

/** Standard uncertainty for the microphone position, u3 = 1.0 dB (ISO 9612:2009, C.6). */
export const microphonePositionUncertaintyDb = 1.0;

/** Measuring instrument kinds of ISO 9612:2009 Table C.5. */
export const iso9612Instruments = ['class1-meter', 'class2-meter', 'dosimeter'] as const;
export type Iso9612Instrument = (typeof iso9612Instruments)[number];

/**
 * Standard uncertainty u2 of the instrumentation (ISO 9612:2009 Table C.5, via REFERENCES.md):
 * class 1 sound level meter 0.7 dB; class 2 sound level meter 1.5 dB; personal sound exposure
 * meter (dosimeter) 1.5 dB.
 */
export const instrumentUncertaintyDb: Readonly<Record<Iso9612Instrument, number>> = Object.freeze({
  'class1-meter': 0.7,
  'class2-meter': 1.5,
  dosimeter: 1.5,
});

/** Words for the instrument kinds, for budgets and messages. */
export const iso9612InstrumentLabels: Readonly<Record<Iso9612Instrument, string>> = Object.freeze({
  'class1-meter': 'class 1 sound level meter',
  'class2-meter': 'class 2 sound level meter',
  dosimeter: 'personal sound exposure meter (dosimeter)',
});

/** The sampling contribution c1·u1 above which ISO 9612:2009 (C.3) asks to revise the plan, dB. */
export const samplingContributionLimitDb = 3.5;

/** One line of an uncertainty budget: a standard uncertainty, its sensitivity coefficient and their product. */
export interface UncertaintyBudgetLine {
  /** What the line is ("Task 'Edging': spread of the measurements (u1a)"). */
  readonly label: string;
  /** Standard uncertainty, dB (hours for a duration term); null when the line is given as a product only. */
  readonly standardUncertainty: number | null;
  /** Sensitivity coefficient; null when the line is given as a product only. */
  readonly sensitivity: number | null;
  /** c·u, dB. */
  readonly contribution: number;
  /** Equation or table of ISO 9612:2009 the line comes from. */
  readonly source: string;
}

/** Result shared by the three strategies. */
export interface Iso9612Result {
  /** LEX,8h, dB, full precision. */
  readonly lex8h: number;
  /** A-weighted equivalent level over the effective day Te, dB. */
  readonly laeqTe: number;
  /** Effective duration of the working day Te, hours. */
  readonly effectiveHours: number;
  /** The budget, one line per term. */
  readonly budget: readonly UncertaintyBudgetLine[];
  /** Combined standard uncertainty u(LEX,8h), dB. */
  readonly combinedUncertainty: number;
  /** Expanded uncertainty U = 1.65·u, dB. */
  readonly expandedUncertainty: number;
  /** Things the standard asks the hygienist to act on (the result is still computed). */
  readonly warnings: readonly string[];
}

/** Throws a RangeError naming the function unless the value is finite. */
export function requireFiniteNumber(functionName: string, what: string, value: unknown): asserts value is number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${functionName}: ${what} must be a finite number, got ${String(value)}`);
  }
}

/** Throws a RangeError naming the function unless the value is a finite number > 0. */
export function requirePositive(functionName: string, what: string, value: unknown): asserts value is number {
  requireFiniteNumber(functionName, what, value);
  if (!(value > 0)) throw new RangeError(`${functionName}: ${what} must be greater than 0, got ${value}`);
}

/** Throws unless `instrument` is one of Table C.5's kinds; returns u2. */
export function instrumentUncertainty(functionName: string, instrument: string): number {
  if (!(iso9612Instruments as readonly string[]).includes(instrument)) {
    throw new RangeError(`${functionName}: instrument must be one of ${iso9612Instruments.join(', ')}, got ${String(instrument)}`);
  }
  return instrumentUncertaintyDb[instrument as Iso9612Instrument];
}

/** Arithmetic mean of levels, dB. */
function arithmeticMean(values: readonly number[]): number {
  return values.reduce((sum, value) => sum + value, 0) / values.length;
}

/**
 * Sample standard deviation (divisor n − 1) of levels in dB: u1 of the job-based and full-day
 * strategies (ISO 9612:2009, equation C.10 as we know it: u1 = √(1/(N−1)·Σ(L_n − L̄)²)).
 */
export function levelStandardDeviation(levelsDb: readonly number[]): number {
  if (levelsDb.length < 2) throw new RangeError(`levelStandardDeviation: needs at least 2 levels, got ${levelsDb.length}`);
  const mean = arithmeticMean(levelsDb);
  const squares = levelsDb.reduce((sum, level) => sum + (level - mean) ** 2, 0);
  return Math.sqrt(squares / (levelsDb.length - 1));
}

/**
 * Standard uncertainty of a task's mean level from the spread of its I measurements:
 * u1a,m = √(1/(I(I−1))·Σ_i (L_m,i − L̄_m)²) — ISO 9612:2009 equation C.5 (task-based).
 */
export function taskSpreadUncertainty(levelsDb: readonly number[]): number {
  return levelStandardDeviation(levelsDb) / Math.sqrt(levelsDb.length);
}

const decibelsPerNeper = 10 / Math.LN10;

/**
 * Sampling contribution c1·u1 (dB) of N samples of a job or of N full days, whose sample
 * standard deviation is u1 (dB).
 *
 * ISO 9612:2009 gives c1·u1 in Table C.4 by N and u1 (with linear interpolation between the
 * printed entries). We could not read the printed table, so the value is computed from the
 * quantity the table expresses: the distance from the energy-mean level to its one-sided 95 %
 * upper confidence limit, divided by the one-sided 95 % normal quantile, for levels that are
 * normally distributed in dB (energies lognormal). The upper limit is Land's exact limit for a
 * lognormal mean (Land 1971, 1975; stats/arithmetic-mean.ts):
 *   c1·u1 = (10/ln 10)·s·H_0.95(N, s)/√(N−1) / 1.645,  s = u1·ln(10)/10.
 * This reconstruction reproduces the expanded uncertainties printed in ISO 9612:2009 Annex E
 * (3.8 dB) and Annex F (3.4 dB) to the printed 0.1 dB; it is ours, not the standard's text, and
 * other (N, u1) may differ from the printed Table C.4 by its rounding or more
 * (docs/decisions/022-iso-9612-strategies.md).
 */
export function samplingContribution(sampleCount: number, standardDeviationDb: number): number {
  if (!Number.isInteger(sampleCount) || sampleCount < 3) {
    throw new RangeError(`samplingContribution: needs at least 3 samples, got ${sampleCount}`);
  }
  requireFiniteNumber('samplingContribution', 'standard deviation', standardDeviationDb);
  if (standardDeviationDb < 0) throw new RangeError(`samplingContribution: standard deviation must be ≥ 0, got ${standardDeviationDb}`);
  if (standardDeviationDb === 0) return 0;
  const logScaleSd = standardDeviationDb / decibelsPerNeper;
  const factor = landFactor(sampleCount, logScaleSd, 0.95);
  return (decibelsPerNeper * logScaleSd * factor) / Math.sqrt(sampleCount - 1) / 1.6448536269514722;
}

/**
 * Minimum cumulative measurement duration of the job-based strategy by the number of workers nG
 * in the noise exposure group, hours — ISO 9612:2009 Table 1 (REFERENCES.md): nG ≤ 5: 5 h;
 * 6–15: 5 + 0.5·(nG − 5) h; 16–40: 10 + 0.25·(nG − 15) h; > 40: 17 h (or split the group).
 */
export function minimumCumulativeHours(groupSize: number): number {
  if (!Number.isInteger(groupSize) || groupSize < 1) {
    throw new RangeError(`minimumCumulativeHours: group size must be a whole number ≥ 1, got ${groupSize}`);
  }
  if (groupSize <= 5) return 5;
  if (groupSize <= 15) return 5 + 0.5 * (groupSize - 5);
  if (groupSize <= 40) return 10 + 0.25 * (groupSize - 15);
  return 17;
}

/** Combined standard uncertainty of independent contributions: √Σ(c·u)². */
export function combineContributions(lines: readonly UncertaintyBudgetLine[]): number {
  return Math.sqrt(lines.reduce((sum, line) => sum + line.contribution ** 2, 0));
}

/** One sample of the job-based or full-day strategy. */
export interface Iso9612Sample {
  /** A-weighted equivalent level of the sample, dB. */
  readonly laeqDb: number;
  /** Measured duration, minutes (job-based: counted toward Table 1's minimum). */
  readonly durationMinutes?: number;
}

/**
 * The common computation of the job-based and full-day strategies (ISO 9612:2009 clauses 10
 * and 11, equations C.9–C.11 as we know them):
 *   LAeq,Te = 10·lg((1/N)·Σ 10^(0.1·L_n)),  LEX,8h = LAeq,Te + 10·lg(Te/T0),
 *   u²(LEX,8h) = c1²u1² + c2²(u2² + u3²), c2 = 1.
 */
export function sampledStrategy(
  functionName: string,
  samples: readonly Iso9612Sample[],
  effectiveHours: number,
  instrument: string,
  sampleWord: string,
): Iso9612Result {
  requirePositive(functionName, 'effective duration Te (hours)', effectiveHours);
  if (effectiveHours > 24) throw new RangeError(`${functionName}: effective duration Te must be at most 24 hours, got ${effectiveHours}`);
  const u2 = instrumentUncertainty(functionName, instrument);
  const levels = samples.map((sample, index) => {
    requireFiniteNumber(functionName, `${sampleWord} ${index + 1} LAeq (dB)`, sample.laeqDb);
    if (sample.laeqDb < 0 || sample.laeqDb > 200) {
      throw new RangeError(`${functionName}: ${sampleWord} ${index + 1} LAeq must lie between 0 and 200 dB, got ${sample.laeqDb}`);
    }
    if (sample.durationMinutes !== undefined) requirePositive(functionName, `${sampleWord} ${index + 1} duration (minutes)`, sample.durationMinutes);
    return sample.laeqDb;
  });
  const laeqTe = energyMeanLevel(levels);
  const lex8h = laeqTe + 10 * Math.log10(effectiveHours / referenceHours);
  const u1 = levelStandardDeviation(levels);
  const c1u1 = samplingContribution(levels.length, u1);
  const budget: UncertaintyBudgetLine[] = [
    {
      label: `Spread of the ${levels.length} ${sampleWord}s (c1·u1, u1 = their standard deviation)`,
      standardUncertainty: u1,
      sensitivity: u1 > 0 ? c1u1 / u1 : null,
      contribution: c1u1,
      source: 'In place of ISO 9612:2009 Table C.4: computed from Land’s exact limit',
    },
    {
      label: `Instrument: ${iso9612InstrumentLabels[instrument as Iso9612Instrument]} (u2)`,
      standardUncertainty: u2,
      sensitivity: 1,
      contribution: u2,
      source: 'ISO 9612:2009 Table C.5',
    },
    {
      label: 'Microphone position (u3)',
      standardUncertainty: microphonePositionUncertaintyDb,
      sensitivity: 1,
      contribution: microphonePositionUncertaintyDb,
      source: 'ISO 9612:2009 C.6',
    },
  ];
  const combinedUncertainty = combineContributions(budget);
  const warnings: string[] = [];
  if (c1u1 > samplingContributionLimitDb) {
    warnings.push(
      `The sampling contribution c1·u1 is ${c1u1.toFixed(1)} dB, above ${samplingContributionLimitDb} dB: ISO 9612 asks to revise the plan (more ${sampleWord}s, or a finer grouping or strategy)`,
    );
  }
  return { lex8h, laeqTe, effectiveHours, budget, combinedUncertainty, expandedUncertainty: coverageFactor * combinedUncertainty, warnings };
}
