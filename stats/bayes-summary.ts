import { normalCdf } from './normal-distribution';
import type { Judgement } from './types';

/** A posterior summary: median, 95 % equal-tailed credible limits (2.5 % and 97.5 % points) and the 95 % point. */
export interface PosteriorSummary {
  median: number;
  lower: number;
  upper: number;
  q95: number;
}

const PROBABILITIES = [0.025, 0.5, 0.95, 0.975] as const;

/**
 * Posterior summary of g(x) for a monotone g, from draws x: order statistics are selected on x (no full
 * sort: Floyd–Rivest selection, expected linear time), mapped through g and
 * interpolated on the g scale with R's default quantile definition (Hyndman & Fan 1996, "Sample
 * quantiles in statistical packages", The American Statistician 50:361–365, type 7). The draws are
 * copied into `scratch` (overwritten; pass one of the draws' length to avoid allocating), or rearranged
 * in place when `scratch` is the draws array itself.
 */
export function summarizeMonotone(
  draws: Float64Array,
  transform: (x: number) => number,
  decreasing = false,
  scratch: Float64Array = new Float64Array(draws.length),
): PosteriorSummary {
  const n = draws.length;
  if (n < 2) throw new RangeError(`summarizeMonotone: needs at least 2 draws, got ${n}`);
  if (scratch.length < n) throw new RangeError(`summarizeMonotone: scratch holds ${scratch.length} values, needs ${n}`);
  if (scratch !== draws) scratch.set(draws);
  const values = scratch.length === n ? scratch : scratch.subarray(0, n);
  // Order statistics needed (type 7: h = (n − 1)p, between floor(h) and floor(h) + 1), ascending.
  const needed = new Set<number>();
  for (const p of PROBABILITIES) {
    const h = (n - 1) * (decreasing ? 1 - p : p);
    needed.add(Math.floor(h));
    needed.add(Math.min(Math.floor(h) + 1, n - 1));
  }
  const ranks = [...needed].sort((a, b) => a - b);
  selectMany(values, 0, n - 1, ranks, 0, ranks.length - 1);
  const orderStatistic = new Map<number, number>();
  for (const rank of ranks) orderStatistic.set(rank, values[rank]);
  const quantile = (p: number): number => {
    // On the g scale, position p of g(x) is position 1 − p of x when g decreases.
    const h = (n - 1) * (decreasing ? 1 - p : p);
    const low = Math.floor(h);
    const high = Math.min(low + 1, n - 1);
    const gLow = transform(orderStatistic.get(low)!);
    const gHigh = transform(orderStatistic.get(high)!);
    // Interpolating between the two mapped order statistics with the x-scale fraction is exactly type 7
    // on the g scale, for increasing and decreasing g alike.
    return gLow + (h - low) * (gHigh - gLow);
  };
  return { lower: quantile(0.025), median: quantile(0.5), q95: quantile(0.95), upper: quantile(0.975) };
}

/**
 * Put every rank of ranks[from..to] (ascending) in its sorted place: select the middle rank, then recurse
 * on each side with the ranks that fall there, so several quantiles cost little more than one.
 */
function selectMany(values: Float64Array, left: number, right: number, ranks: readonly number[], from: number, to: number): void {
  if (from > to || left >= right) return;
  const middle = (from + to) >>> 1;
  const rank = ranks[middle];
  select(values, left, right, rank);
  selectMany(values, left, rank - 1, ranks, from, middle - 1);
  selectMany(values, rank + 1, right, ranks, middle + 1, to);
}

/**
 * Rearrange values[left..right] so that values[k] is the k-th smallest and the parts on either side are
 * below and above it: Floyd & Rivest (1975), "Algorithm 489: The algorithm SELECT — for finding the ith
 * smallest of n elements", CACM 18(3):173, which first narrows the range around k on a sample, needing
 * about n + min(k, n − k) comparisons.
 */
function select(values: Float64Array, left: number, right: number, k: number): void {
  while (right > left) {
    if (right - left > 600) {
      const n = right - left + 1;
      const m = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (m - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (m * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - m) * s) / n + sd));
      select(values, newLeft, newRight, k);
    }
    const pivot = values[k];
    let i = left;
    let j = right;
    swap(values, left, k);
    if (values[right] > pivot) swap(values, left, right);
    while (i < j) {
      swap(values, i, j);
      i++;
      j--;
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
    }
    if (values[left] === pivot) swap(values, left, j);
    else {
      j++;
      swap(values, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
}

function swap(values: Float64Array, i: number, j: number): void {
  const t = values[i];
  values[i] = values[j];
  values[j] = t;
}

/**
 * Posterior probabilities that the 95th percentile lies in each exposure category, as shares of the draws:
 * 0 ≤ 1 %, 1 ≤ 10 %, 2 ≤ 50 %, 3 ≤ 100 %, 4 > 100 % of the OEL (category bands as stated in Hewett,
 * Logan, Mulhausen, Ramachandran & Banerjee 2006, "Rating exposure control using Bayesian decision
 * analysis", JOEH 3:568–581). `logP95` holds ln P95 per draw.
 */
export function categoryProbabilities(logP95: Float64Array, oel: number): [number, number, number, number, number] {
  if (!(oel > 0) || !Number.isFinite(oel)) throw new RangeError(`categoryProbabilities: oel must be a finite number > 0, got ${oel}`);
  if (logP95.length === 0) throw new RangeError('categoryProbabilities: needs at least one draw');
  const cut1 = Math.log(0.01 * oel);
  const cut2 = Math.log(0.1 * oel);
  const cut3 = Math.log(0.5 * oel);
  const cut4 = Math.log(oel);
  const counts = [0, 0, 0, 0, 0];
  for (let i = 0; i < logP95.length; i++) {
    const v = logP95[i];
    counts[v <= cut1 ? 0 : v <= cut2 ? 1 : v <= cut3 ? 2 : v <= cut4 ? 3 : 4]++;
  }
  const n = logP95.length;
  return [counts[0] / n, counts[1] / n, counts[2] / n, counts[3] / n, counts[4] / n];
}

/** Default organization threshold on P(P95 > OEL) at or above which the Bayesian view judges a group unacceptable. */
export const DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD = 0.3;
/** P(P95 > OEL) at or below which the Bayesian view judges a group acceptable (the 95 % confidence of the UTL95%,95% rule). */
export const BAYES_ACCEPTABLE_THRESHOLD = 0.05;

/**
 * Bayesian judgement on the posterior probability that the 95th percentile exceeds the OEL (see
 * docs/decisions/003-bayesian-view.md): unacceptable when P(P95 > OEL) ≥ the organization's threshold
 * (default 0.30: a posterior probability of about 30 % that X0.95 exceeds the OEL is used in the
 * Bayesian exposure literature as the mark of a poorly controlled group, after Hewett et al. 2006 —
 * *from memory*, see REFERENCES.md); acceptable when P(P95 > OEL) ≤ 0.05, which is the posterior twin
 * of the classical rule "UTL95%,95% ≤ OEL" (under the reference prior the posterior 95 % point of P95
 * equals the UTL); uncertain otherwise.
 */
export function bayesianJudgement(probabilityAboveOel: number, unacceptableThreshold = DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD): Judgement {
  if (!(probabilityAboveOel >= 0 && probabilityAboveOel <= 1)) {
    throw new RangeError(`bayesianJudgement: probabilityAboveOel must be within [0, 1], got ${probabilityAboveOel}`);
  }
  if (!(unacceptableThreshold > BAYES_ACCEPTABLE_THRESHOLD && unacceptableThreshold <= 1)) {
    throw new RangeError(`bayesianJudgement: unacceptableThreshold must be above ${BAYES_ACCEPTABLE_THRESHOLD} and at most 1, got ${unacceptableThreshold}`);
  }
  if (probabilityAboveOel >= unacceptableThreshold) return 'unacceptable';
  if (probabilityAboveOel <= BAYES_ACCEPTABLE_THRESHOLD) return 'acceptable';
  return 'uncertain';
}

/** Exceedance fraction 1 − Φ(t) for t = (ln OEL − μ)/σ: a decreasing function of t. */
export function exceedanceFromStandardized(t: number): number {
  return normalCdf(-t);
}
