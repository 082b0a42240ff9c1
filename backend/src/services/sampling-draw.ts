import { randomInt } from 'node:crypto';
import { maximumSeed } from '@schema/sampling-plans';
import { createRandom } from '@stats/random';
import { eachDate, isWeekend } from './dates';

/*
 * The random choice of worker-shifts for a sampling plan, kept free of the database so the demo
 * seed and the tests use exactly what the service uses. Every worker-shift in the plan's window
 * (each date × each worker who is a member on it) gets the same chance: a simple random sample
 * without replacement, the basis of the random sampling in Leidel, Busch & Lynch (1977), NIOSH
 * Occupational Exposure Sampling Strategy Manual (from memory). Same candidates and seed → same picks.
 */

/** A membership period as the draw needs it. */
export interface MemberPeriod {
  workerId: number;
  workerCode: string;
  fromDate: string;
  toDate: string | null;
}

/** One worker-shift that may be picked. */
export interface CandidateShift {
  workerId: number;
  workerCode: string;
  date: string;
}

export interface DrawnShift extends CandidateShift {
  /** Order in which the draw picked it (1 = first). */
  position: number;
}

/**
 * Every worker-shift from `startDate` to `endDate`: each date (Monday to Friday unless weekends are
 * included) × each worker whose membership covers it. Sorted by date, worker code and id, so the
 * list — and with it the draw — does not depend on the order the database returned rows in.
 */
export function candidateShifts(periods: readonly MemberPeriod[], window: { startDate: string; endDate: string; includeWeekends: boolean }): CandidateShift[] {
  const candidates: CandidateShift[] = [];
  const seen = new Set<string>();
  for (const date of eachDate(window.startDate, window.endDate)) {
    if (!window.includeWeekends && isWeekend(date)) continue;
    for (const period of periods) {
      if (period.fromDate > date || (period.toDate !== null && period.toDate < date)) continue;
      const key = `${period.workerId}|${date}`;
      if (seen.has(key)) continue;
      seen.add(key);
      candidates.push({ workerId: period.workerId, workerCode: period.workerCode, date });
    }
  }
  return candidates.sort((a, b) => a.date.localeCompare(b.date) || a.workerCode.localeCompare(b.workerCode) || a.workerId - b.workerId);
}

/**
 * Draws `count` candidates (all of them when there are fewer) by a partial Fisher–Yates shuffle
 * (Knuth, TAOCP vol. 2, Algorithm 3.4.2P) driven by the seeded MT19937 of stats/random.ts.
 * Returned in date order with the position each was drawn at.
 */
export function drawShifts(candidates: readonly CandidateShift[], count: number, seed: number): DrawnShift[] {
  const random = createRandom(seed);
  const pool = [...candidates];
  const take = Math.min(count, pool.length);
  const drawn: DrawnShift[] = [];
  for (let index = 0; index < take; index++) {
    const chosen = index + random.integer(pool.length - index);
    [pool[index], pool[chosen]] = [pool[chosen], pool[index]];
    drawn.push({ ...pool[index], position: index + 1 });
  }
  return drawn.sort((a, b) => a.date.localeCompare(b.date) || a.workerCode.localeCompare(b.workerCode) || a.workerId - b.workerId);
}

/** A new seed from the operating system's random source, different from `avoid`. */
export function newSeed(avoid?: number): number {
  for (;;) {
    const seed = randomInt(1, maximumSeed + 1);
    if (seed !== avoid) return seed;
  }
}
