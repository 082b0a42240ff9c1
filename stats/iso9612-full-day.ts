/**
 * ISO 9612:2009 full-day strategy (clause 11): at least 3 full-day measurements (each covering the
 * whole effective day), their energy mean as LAeq,Te, LEX,8h = LAeq,Te + 10·lg(Te/T0), with the
 * uncertainty of Annex C as for the job-based strategy (c1·u1 by the number of days and their
 * standard deviation; stats/iso9612-uncertainty.ts).
 */
import { sampledStrategy, type Iso9612Result, type Iso9612Sample } from './iso9612-uncertainty';

/** Fewest full days (ISO 9612:2009, 11.x: at least 3). */
export const fullDayMinimumDays = 3;

export interface FullDayInput {
  /** One LAeq per measured day, each over the whole effective day. */
  readonly days: readonly Iso9612Sample[];
  /** Effective duration of the working day Te, hours. */
  readonly effectiveHours: number;
  /** Instrument kind of Table C.5. */
  readonly instrument: string;
}

/**
 * LEX,8h with its uncertainty by the full-day strategy.
 * Method: ISO 9612:2009 clause 11 and Annex C (C.4). Throws a RangeError naming the rule for
 * fewer than 3 days, a level that is not finite, a Te outside (0, 24] h or an unknown instrument.
 */
export function fullDayEstimate(input: FullDayInput): Iso9612Result {
  const name = 'fullDayEstimate';
  if ((input.days?.length ?? 0) < fullDayMinimumDays) {
    throw new RangeError(`${name}: ${input.days?.length ?? 0} days given; the ISO 9612 full-day strategy needs at least ${fullDayMinimumDays}`);
  }
  return sampledStrategy(name, input.days, input.effectiveHours, input.instrument, 'day');
}
