import { incompleteBetaStep, regularizedIncompleteBeta } from './incomplete-beta';
import { logGamma } from './log-gamma';
import { normalCdf, normalQuantile } from './normal-distribution';
import { rootFromGuess } from './root-finding';

/**
 * The noncentral t distribution: T = (Z + δ)/√(χ²_ν/ν), with ν degrees of freedom and
 * noncentrality δ. Used for the tolerance factor, the EN 689 UT value and the exceedance-fraction
 * confidence limits.
 *
 * CDF method: the Poisson-mixture series of Lenth (1989), Algorithm AS 243, Applied Statistics
 * 38:185–189, for t ≥ 0:
 *   F(t; ν, δ) = Φ(−δ) + ½ Σ_{j≥0} [ p_j·I_x(j + ½, ν/2) + q_j·I_x(j + 1, ν/2) ],  x = t²/(t² + ν),
 *   p_j = e^{−δ²/2}(δ²/2)^j / j!,  q_j = δ·e^{−δ²/2}(δ²/2)^j / (√2·Γ(j + 3/2)),
 * summed, as Benton & Krishnamoorthy (2003), Computational Statistics & Data Analysis 43:249–267,
 * recommend, outwards from the most heavily weighted term j = ⌊δ²/2⌋ with the incomplete-beta
 * recurrence in both directions, stopping on a geometric bound of the remaining Poisson weight.
 * For t < 0, F(t; ν, δ) = P(−T ≥ −t) with −T noncentral t with noncentrality −δ.
 *
 * Checked against scipy.stats.nct (tests/fixtures/stats/noncentral-t.json) to 1e−9 relative over
 * ν 2–5000 and |δ| up to 150 where the CDF lies in [1e−10, 1 − 1e−10]. One known limit: for
 * t < 0 < δ the lower tail is computed as a complement, so a tail below ~1e−4 there is accurate
 * to ~1e−13 absolute rather than relative (the confidence limits never need such tails).
 */

const EPSILON = 1e-15;

/** Beyond this |δ| the Poisson series would need millions of terms; the functions refuse it. */
export const MAX_NONCENTRALITY = 4000;
const SQRT_HALF = Math.SQRT1_2;

function checkParameters(name: string, degreesOfFreedom: number, noncentrality: number): void {
  if (!(degreesOfFreedom > 0) || !Number.isFinite(degreesOfFreedom)) {
    throw new RangeError(`${name}: degreesOfFreedom must be a positive finite number, got ${degreesOfFreedom}`);
  }
  if (!Number.isFinite(noncentrality) || Math.abs(noncentrality) > MAX_NONCENTRALITY) {
    throw new RangeError(`${name}: noncentrality must be a finite number from −${MAX_NONCENTRALITY} to ${MAX_NONCENTRALITY}, got ${noncentrality}`);
  }
}

/** I_x(a, b), or its complement I_{1−x}(b, a) for the upper-tail series. */
function seriesBeta(x: number, y: number, a: number, b: number, upper: boolean): number {
  return upper ? regularizedIncompleteBeta(y, b, a, x) : regularizedIncompleteBeta(x, a, b, y);
}

/**
 * For t ≥ 0: P(T ≤ t) when `upper` is false, P(T > t) when it is true. The upper tail uses the
 * same series with the complements 1 − I_x = I_{1−x}(ν/2, a) (Σp_j = 1 and Σq_j = 1 − 2Φ(−δ)),
 * so a small upper tail keeps its relative precision when δ ≥ 0.
 */
function series(t: number, degreesOfFreedom: number, delta: number, upper: boolean): number {
  // At t = 0 the series is empty: P(T ≤ 0) = Φ(−δ), P(T > 0) = Φ(δ).
  if (t === 0) return upper ? normalCdf(delta) : normalCdf(-delta);
  const baseline = upper ? 0 : normalCdf(-delta);
  const tSquared = t * t;
  const x = tSquared / (tSquared + degreesOfFreedom);
  const y = degreesOfFreedom / (tSquared + degreesOfFreedom);
  const b = degreesOfFreedom / 2;
  // Forwards the lower-tail I_x falls by the step, the upper-tail complement rises by it.
  const sign = upper ? 1 : -1;
  const lambda = (delta * delta) / 2;
  if (lambda === 0) return baseline + 0.5 * seriesBeta(x, y, 0.5, b, upper);

  const mode = Math.floor(lambda);
  const logLambda = Math.log(lambda);
  const pMode = Math.exp(-lambda + mode * logLambda - logGamma(mode + 1));
  const qMode = delta * SQRT_HALF * Math.exp(-lambda + mode * logLambda - logGamma(mode + 1.5));
  const betaPMode = seriesBeta(x, y, mode + 0.5, b, upper);
  const betaQMode = seriesBeta(x, y, mode + 1, b, upper);
  const stepPMode = incompleteBetaStep(x, y, mode + 0.5, b);
  const stepQMode = incompleteBetaStep(x, y, mode + 1, b);
  let sum = pMode * betaPMode + qMode * betaQMode;

  // Forwards: I_x(a+1, b) = I_x(a, b) − step(a), step(a+1) = step(a)·x(a+b)/(a+1).
  let p = pMode;
  let q = qMode;
  let betaP = betaPMode;
  let betaQ = betaQMode;
  let stepP = stepPMode;
  let stepQ = stepQMode;
  for (let j = mode + 1; j < mode + 1_000_000; j++) {
    const aP = j - 0.5; // the P-series parameter of the previous term
    const aQ = j; // the Q-series parameter of the previous term
    betaP = Math.min(1, Math.max(0, betaP + sign * stepP));
    betaQ = Math.min(1, Math.max(0, betaQ + sign * stepQ));
    stepP *= (x * (aP + b)) / (aP + 1);
    stepQ *= (x * (aQ + b)) / (aQ + 1);
    p *= lambda / j;
    q *= lambda / (j + 0.5);
    sum += p * betaP + q * betaQ;
    // Bound on what is left (Benton & Krishnamoorthy 2003, §3): past the mode the Poisson weights
    // fall at least geometrically with ratio r = λ/(j+1), |q_i|/p_i only falls, and the lower-tail
    // I_x only falls (the upper-tail complement stays below 1).
    const ratio = lambda / (j + 1);
    const poissonTail = (p * ratio) / (1 - ratio);
    const bound = upper ? poissonTail * (1 + Math.abs(q / p)) : poissonTail * (betaP + Math.abs(q / p) * betaQ);
    if (!(bound > EPSILON * Math.abs(sum)) || p === 0) break;
  }

  // Backwards: I_x(a−1, b) = I_x(a, b) + step(a−1), step(a−1) = step(a)·a/(x(a−1+b)).
  p = pMode;
  q = qMode;
  betaP = betaPMode;
  betaQ = betaQMode;
  stepP = stepPMode;
  stepQ = stepQMode;
  for (let j = mode - 1; j >= 0; j--) {
    const aP = j + 1.5; // parameter of the following (already used) term
    const aQ = j + 2;
    stepP *= aP / (x * (aP - 1 + b));
    stepQ *= aQ / (x * (aQ - 1 + b));
    betaP = Math.min(1, Math.max(0, betaP - sign * stepP));
    betaQ = Math.min(1, Math.max(0, betaQ - sign * stepQ));
    p *= (j + 1) / lambda;
    q *= (j + 1.5) / lambda;
    sum += p * betaP + q * betaQ;
    // Below the mode the weights fall at least geometrically with ratio j/λ; every I is ≤ 1.
    const ratio = j / lambda;
    const bound = ((p * ratio) / (1 - ratio)) * (1 + Math.abs(q / p));
    if (!(bound > EPSILON * Math.abs(sum)) || p === 0) break;
  }
  return baseline + 0.5 * sum;
}

/**
 * Noncentral t cumulative distribution function P(T ≤ t) (method in the file comment).
 * noncentralTCdf(2, 10, 1) → 0.8002302962 (scipy.stats.nct.cdf(2, 10, 1))
 */
export function noncentralTCdf(t: number, degreesOfFreedom: number, noncentrality: number): number {
  checkParameters('noncentralTCdf', degreesOfFreedom, noncentrality);
  if (Number.isNaN(t)) throw new RangeError('noncentralTCdf: t must be a number, got NaN');
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  let value: number;
  if (t >= 0) value = series(t, degreesOfFreedom, noncentrality, false);
  // P(T ≤ t) = P(−T ≥ −t), and −T is noncentral t with noncentrality −δ.
  else if (noncentrality <= 0) value = series(-t, degreesOfFreedom, -noncentrality, true);
  // t < 0 < δ: the upper-tail series would cancel; the complement is used (absolute error ~1e−16).
  else value = 1 - series(-t, degreesOfFreedom, -noncentrality, false);
  if (Number.isNaN(value)) {
    throw new RangeError(`noncentralTCdf: the series failed for t=${t}, ν=${degreesOfFreedom}, δ=${noncentrality}`);
  }
  return Math.min(1, Math.max(0, value));
}

/** A normal approximation to the quantile, the starting point of the root search (Johnson, Kotz & Balakrishnan 1995, eq. 31.26). */
function approximateQuantile(p: number, degreesOfFreedom: number, noncentrality: number): number {
  const z = normalQuantile(p);
  const scale = Math.sqrt(1 + (noncentrality * noncentrality) / (2 * degreesOfFreedom));
  return noncentrality + z * scale;
}

/**
 * Noncentral t quantile: the t with P(T ≤ t) = p, found by Brent's method on the CDF
 * (relative tolerance 1e−13). noncentralTQuantile(0.95, 9, 1.6448536269514722·√10)/√10 → 2.911
 * (the one-sided tolerance factor K for n = 10, NIST/SEMATECH e-Handbook 7.2.6.3).
 */
export function noncentralTQuantile(p: number, degreesOfFreedom: number, noncentrality: number): number {
  checkParameters('noncentralTQuantile', degreesOfFreedom, noncentrality);
  if (!(p > 0 && p < 1)) throw new RangeError(`noncentralTQuantile: p must lie strictly between 0 and 1, got ${p}`);
  const guess = approximateQuantile(p, degreesOfFreedom, noncentrality);
  const f = (t: number) => noncentralTCdf(t, degreesOfFreedom, noncentrality) - p;
  const spread = Math.max(0.1, 0.1 * Math.abs(guess));
  const direction = f(guess) < 0 ? 1 : -1;
  return rootFromGuess(f, guess, direction * spread, { tolerance: 1e-13 * (1 + Math.abs(guess)), limit: 1e12 });
}

export interface NoncentralitySearchBounds {
  /** Lowest δ to search; below it the answer is reported as −Infinity. */
  lowest?: number;
  /** Highest δ to search; above it the answer is reported as +Infinity. */
  highest?: number;
}

/**
 * The noncentrality δ with P(T ≤ t | ν, δ) = p: the inversion used for exact confidence limits on
 * a normal proportion (Owen 1968, "A survey of properties and applications of the noncentral
 * t-distribution", Technometrics 10:445–478, §4; Odeh & Owen 1980). F falls as δ grows, so the root
 * is unique. It is bracketed outwards from a normal-approximation guess and refined by Brent's
 * method. When the root lies outside [lowest, highest] the result is −Infinity or +Infinity, so a
 * caller can stop where the answer no longer changes a reported figure.
 */
export function noncentralityForProbability(t: number, degreesOfFreedom: number, p: number, bounds: NoncentralitySearchBounds = {}): number {
  checkParameters('noncentralityForProbability', degreesOfFreedom, 0);
  if (!Number.isFinite(t)) throw new RangeError(`noncentralityForProbability: t must be a finite number, got ${t}`);
  if (!(p > 0 && p < 1)) throw new RangeError(`noncentralityForProbability: p must lie strictly between 0 and 1, got ${p}`);
  const lowest = Math.max(bounds.lowest ?? -MAX_NONCENTRALITY, -MAX_NONCENTRALITY);
  const highest = Math.min(bounds.highest ?? MAX_NONCENTRALITY, MAX_NONCENTRALITY);
  if (!(lowest < highest)) throw new RangeError('noncentralityForProbability: lowest must be below highest');
  const z = normalQuantile(p);
  const approximate = t - z * Math.sqrt(1 + (t * t) / (2 * degreesOfFreedom));
  const guess = Math.min(highest, Math.max(lowest, approximate));
  const f = (delta: number) => noncentralTCdf(t, degreesOfFreedom, delta) - p;
  const fGuess = f(guess);
  // F falls as δ grows: step up while F is still above p.
  const direction = fGuess > 0 ? 1 : -1;
  return rootFromGuess(f, guess, direction * Math.max(0.1, 0.05 * Math.abs(guess)), {
    valueAtStart: fGuess,
    relativeTolerance: 1e-13,
    lowest,
    highest,
    limit: Infinity,
  });
}
