/**
 * ISO 9612:2009 job-based strategy (clause 10): N ≥ 5 samples taken at random over the work of a
 * noise exposure group, their energy mean as LAeq,Te, LEX,8h = LAeq,Te + 10·lg(Te/T0), and the
 * uncertainty of Annex C with c1·u1 by N and the samples' standard deviation (Table C.4, computed:
 * stats/iso9612-uncertainty.ts). The cumulative sampled duration is compared with Table 1.
 */
import { minimumCumulativeHours, requirePositive, sampledStrategy, type Iso9612Result, type Iso9612Sample } from './iso9612-uncertainty';

/** Fewest samples of the job-based strategy (ISO 9612:2009, 10.x: N ≥ 5). */
export const jobBasedMinimumSamples = 5;

export interface JobBasedInput {
  readonly samples: readonly Iso9612Sample[];
  /** Effective duration of the working day Te, hours. */
  readonly effectiveHours: number;
  /** Instrument kind of Table C.5. */
  readonly instrument: string;
  /** Number of workers in the noise exposure group nG (for Table 1). */
  readonly groupSize: number;
}

export interface JobBasedResult extends Iso9612Result {
  /** Sum of the samples' durations, hours; null when a duration is missing. */
  readonly cumulativeHours: number | null;
  /** Table 1 minimum for the group size, hours. */
  readonly minimumCumulativeHours: number;
}

/**
 * LEX,8h with its uncertainty by the job-based strategy.
 * Method: ISO 9612:2009 clause 10 and Annex C (C.3). Throws a RangeError naming the rule for
 * fewer than 5 samples, a level or duration that is not a positive finite number, or an unknown
 * instrument. Warns when the cumulative duration is below Table 1's minimum for nG, when nG > 40
 * (the standard suggests splitting the group) and when c1·u1 > 3.5 dB.
 */
export function jobBasedEstimate(input: JobBasedInput): JobBasedResult {
  const name = 'jobBasedEstimate';
  if ((input.samples?.length ?? 0) < jobBasedMinimumSamples) {
    throw new RangeError(`${name}: ${input.samples?.length ?? 0} samples given; the ISO 9612 job-based strategy needs at least ${jobBasedMinimumSamples}`);
  }
  requirePositive(name, 'group size nG', input.groupSize);
  if (!Number.isInteger(input.groupSize)) throw new RangeError(`${name}: group size nG must be a whole number, got ${input.groupSize}`);
  const result = sampledStrategy(name, input.samples, input.effectiveHours, input.instrument, 'sample');
  const minimum = minimumCumulativeHours(input.groupSize);
  const durations = input.samples.map((sample) => sample.durationMinutes);
  const cumulativeHours = durations.every((minutes) => minutes !== undefined) ? durations.reduce((sum: number, minutes) => sum + (minutes ?? 0), 0) / 60 : null;
  const warnings = [...result.warnings];
  if (cumulativeHours === null) {
    warnings.push(`Give every sample's duration to check the ISO 9612 Table 1 minimum of ${minimum} h for a group of ${input.groupSize}`);
  } else if (cumulativeHours < minimum - 1e-9) {
    warnings.push(
      `The samples add up to ${cumulativeHours.toFixed(2)} h, below the ISO 9612 Table 1 minimum of ${minimum} h for a group of ${input.groupSize}: take more samples`,
    );
  }
  if (input.groupSize > 40) warnings.push(`A group of ${input.groupSize} is over 40 workers: ISO 9612 Table 1 suggests splitting it (17 h minimum otherwise)`);
  return { ...result, warnings, cumulativeHours, minimumCumulativeHours: minimum };
}
