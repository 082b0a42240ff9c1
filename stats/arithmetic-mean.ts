import { gaussLegendreRule } from './gauss-legendre';
import { checkLogScaleSummary, type LogScaleSummary } from './log-scale-summary';
import { normalCdf, normalQuantile } from './normal-distribution';
import { rootFromGuess } from './root-finding';

/**
 * The arithmetic mean of a lognormal exposure distribution, exp(μ + σ²/2): its minimum-variance
 * unbiased estimate and Land's exact confidence limits. All inputs are the log-scale summary of a
 * complete (no non-detects) sample: n, the mean ȳ and the standard deviation s (divisor n − 1) of
 * the natural logs.
 */

function checkSummary(name: string, summary: LogScaleSummary): void {
  checkLogScaleSummary(name, summary, 3);
}

/**
 * Aitchison & Brown's ψ_n(t) (Finney's g_n(t)):
 *   ψ_n(t) = 1 + (n−1)t/n + Σ_{j≥2} (n−1)^{2j−1} t^j / (n^j (n+1)(n+3)…(n+2j−3) j!).
 * Method: Finney (1941), "On the distribution of a variate whose logarithm is normally
 * distributed", JRSS Suppl. 7:155–161, eq. (13); Aitchison & Brown (1957), The Lognormal
 * Distribution, §5.41. The series is entire; terms are summed until they no longer change the sum.
 */
export function finneyPsi(n: number, t: number): number {
  if (!Number.isInteger(n) || n < 2) throw new RangeError(`finneyPsi: n must be an integer of at least 2, got ${n}`);
  if (!(t >= 0) || !Number.isFinite(t)) throw new RangeError(`finneyPsi: t must be a finite number ≥ 0, got ${t}`);
  const nMinusOne = n - 1;
  let term = (nMinusOne * t) / n; // j = 1
  let sum = 1 + term;
  for (let j = 2; j < 10_000; j++) {
    // term_j / term_{j−1} = (n−1)² t / (n (n + 2j − 3) j)
    term *= (nMinusOne * nMinusOne * t) / (n * (n + 2 * j - 3) * j);
    sum += term;
    if (term <= 1e-17 * sum) return sum;
  }
  throw new RangeError(`finneyPsi: series did not converge for n=${n}, t=${t}`);
}

/**
 * Minimum-variance unbiased estimate of the lognormal arithmetic mean: exp(ȳ)·ψ_n(s²/2)
 * (Finney 1941; Aitchison & Brown 1957, §5.41). Published check: 0.043, 0.236, 0.057, 0.016 → 0.085.
 */
export function arithmeticMeanMvue(summary: LogScaleSummary): number {
  checkSummary('arithmeticMeanMvue', summary);
  return Math.exp(summary.mean) * finneyPsi(summary.n, (summary.sd * summary.sd) / 2);
}

/*
 * Land's exact limits. Land (1971), "Confidence intervals for linear functions of the normal mean
 * and variance", Ann. Math. Statist. 42:1187–1205, derives the uniformly most accurate unbiased
 * limits for θ = μ + λσ² (λ = ½ for the lognormal mean) from the exponential-family form of the
 * normal sample: with y′ = y − θ₀, the hypothesis θ = θ₀ fixes the natural parameter μ′/σ² = −λ,
 * and the test conditions on the sufficient statistic T = Σy′² of the other one. Given T, the
 * density of ȳ′ is ∝ exp(−nλȳ′)·(T − nȳ′²)^{(n−3)/2}. Writing √n·ȳ′/√T = −cos φ, φ ∈ (0, π),
 * the conditional density of φ is
 *     f(φ) ∝ exp(κ cos φ)·sin^{n−2} φ,   κ = λ√(nT),
 * which is smooth on (0, π) for every n ≥ 3 (the substitution removes the endpoint singularity
 * of (1 − w²)^{(n−3)/2}). The observed angle is φ_obs = atan2(√Σ(y−ȳ)², −√n·(ȳ − θ₀)).
 * The 100(1−α)% upper limit θ_U solves P(φ ≤ φ_obs | κ(θ_U)) = α, the lower limit θ_L solves
 * P(φ ≤ φ_obs | κ(θ_L)) = 1 − α (Land 1971, §3; Land 1975, Selected Tables in Mathematical
 * Statistics III:385–419, which tabulates H with θ = ȳ + s²/2 + s·H/√(n−1)).
 * Here the conditional probability is integrated numerically (composite 10-point Gauss–Legendre
 * around the mode, which has the closed form cos φ* = 2κ/(n−2 + √((n−2)² + 4κ²)), out to where the
 * integrand falls below e^{−34} of its peak, a neglected mass under 1e−14) and θ is found by Brent's method: every H is computed,
 * nothing is read from a table.
 */

const RULE = gaussLegendreRule(10);
const LOG_CUTOFF = -34;

interface ConditionalShape {
  mode: number;
  modeCos: number;
  modeSin: number;
  /** 1/√(−h″) at the mode: the width of the Laplace (normal) approximation. */
  width: number;
}

/** Mode and curvature of h(φ) = κ cos φ + m ln sin φ; h′ = 0 ⟺ κ cos²φ + m cos φ − κ = 0. */
function conditionalShape(m: number, kappa: number): ConditionalShape {
  const modeCos = kappa > 0 ? (2 * kappa) / (m + Math.sqrt(m * m + 4 * kappa * kappa)) : 0;
  const modeSin = Math.sqrt(1 - modeCos * modeCos);
  return { mode: Math.acos(modeCos), modeCos, modeSin, width: 1 / Math.sqrt(kappa * modeCos + m / (modeSin * modeSin)) };
}

/** h(φ) − h(φ*) for h(φ) = κ cos φ + m ln sin φ: the log of the integrand relative to its peak. */
function relativeLogDensity(phi: number, m: number, kappa: number, modeCos: number, modeSin: number): number {
  return kappa * (Math.cos(phi) - modeCos) + m * Math.log(Math.sin(phi) / modeSin);
}

/** ∫ exp(h − h*) over [from, to] in panels of at most `panelWidth`, each by the 10-point rule. */
function integrateDensity(from: number, to: number, panelWidth: number, m: number, kappa: number, modeCos: number, modeSin: number): number {
  const panels = Math.max(1, Math.ceil((to - from) / panelWidth));
  const step = (to - from) / panels;
  const halfWidth = step / 2;
  const { nodes, weights } = RULE;
  let sum = 0;
  for (let panel = 0; panel < panels; panel++) {
    const middle = from + (panel + 0.5) * step;
    for (let i = 0; i < nodes.length; i++) {
      sum += weights[i] * Math.exp(relativeLogDensity(middle + halfWidth * nodes[i], m, kappa, modeCos, modeSin));
    }
  }
  return sum * halfWidth;
}

/** P(φ ≤ φ_obs) under f(φ) ∝ exp(κ cos φ)·sin^m φ on (0, π). */
function conditionalProbability(m: number, kappa: number, observedAngle: number): number {
  const { mode, modeCos, modeSin, width } = conditionalShape(m, kappa);
  // Step out from the mode (the density is unimodal: h′ = 0 has one root on (0, π)).
  const stride = 2 * width;
  let lower = mode;
  while (lower > 0 && relativeLogDensity(lower, m, kappa, modeCos, modeSin) > LOG_CUTOFF) lower -= stride;
  lower = Math.max(0, lower);
  let upper = mode;
  while (upper < Math.PI && relativeLogDensity(upper, m, kappa, modeCos, modeSin) > LOG_CUTOFF) upper += stride;
  upper = Math.min(Math.PI, upper);
  if (observedAngle <= lower) return 0;
  if (observedAngle >= upper) return 1;
  const panelWidth = 3 * width;
  const below = integrateDensity(lower, observedAngle, panelWidth, m, kappa, modeCos, modeSin);
  const above = integrateDensity(observedAngle, upper, panelWidth, m, kappa, modeCos, modeSin);
  return below / (below + above);
}

interface LandState {
  kappa: number;
  observedAngle: number;
}

/** κ and φ_obs for the candidate θ₀ = ȳ + s²/2 + s·H/√(n−1), with ȳ = 0 (the limits shift with ȳ). */
function landState(n: number, sd: number, factor: number): LandState {
  const sumOfSquares = (n - 1) * sd * sd;
  const theta = (sd * sd) / 2 + (sd * factor) / Math.sqrt(n - 1);
  const shiftedMean = -theta; // ȳ − θ₀ with ȳ = 0
  const total = sumOfSquares + n * shiftedMean * shiftedMean;
  return {
    kappa: 0.5 * Math.sqrt(n * total),
    observedAngle: Math.atan2(Math.sqrt(sumOfSquares), -Math.sqrt(n) * shiftedMean),
  };
}

function landProbability(n: number, sd: number, factor: number): number {
  const { kappa, observedAngle } = landState(n, sd, factor);
  return conditionalProbability(n - 2, kappa, observedAngle);
}

/** The same probability by the Laplace (normal) approximation at the mode: only a starting value. */
function approximateLandProbability(n: number, sd: number, factor: number): number {
  const { kappa, observedAngle } = landState(n, sd, factor);
  const { mode, width } = conditionalShape(n - 2, kappa);
  return normalCdf((observedAngle - mode) / width);
}

/**
 * Land's factor H_p(n, s): the exact one-sided 100p% confidence limit for ln(arithmetic mean) is
 * ȳ + s²/2 + s·H_p/√(n−1). p > 0.5 gives an upper limit (H_0.95), p < 0.5 a lower one (H_0.05).
 * Method: Land (1971, 1975), computed as described above. Checks: H_0.95(15, 0.4272) ≈ 1.9939
 * (EPA QA/G-9 Box 3-12, read from Land's table); H_0.95(10, 0.5) → 2.220.
 */
export function landFactor(n: number, sd: number, p: number): number {
  checkSummary('landFactor', { n, mean: 0, sd });
  if (!(p > 0 && p < 1) || p === 0.5) {
    throw new RangeError(`landFactor: p must lie strictly between 0 and 1 and differ from 0.5, got ${p}`);
  }
  // Upper limit at level p: P(φ ≤ φ_obs) = 1 − p; lower limit at level 1 − p: P(φ ≤ φ_obs) = 1 − p too.
  const target = 1 - p;
  // The probability falls as H grows. The search runs on the normal scores Φ⁻¹(P), which are
  // nearly linear in H, so Brent's interpolation steps land close; a root of the Laplace
  // approximation is the starting value.
  const targetScore = normalQuantile(target);
  const approximate = (factor: number) => approximateLandProbability(n, sd, factor) - target;
  let start = 0;
  try {
    start = rootFromGuess(approximate, 0, approximate(0) > 0 ? 1 : -1, { tolerance: 1e-6, limit: 1e4 });
  } catch {
    // For n = 3 or 4 the approximation may never reach the target; the exact search then starts at 0.
  }
  const exact = (factor: number) => probabilityScore(landProbability(n, sd, factor)) - targetScore;
  const atStart = exact(start);
  // A Newton-like first step: the scores fall by roughly one unit per unit of H.
  return rootFromGuess(exact, start, atStart * 0.8 + (atStart > 0 ? 0.01 : -0.01), {
    relativeTolerance: 1e-10,
    limit: 1e8,
    valueAtStart: atStart,
  });
}

/** Φ⁻¹(p), held finite at the quadrature cut-off for p of exactly 0 or 1. */
function probabilityScore(p: number): number {
  if (p <= 1e-300) return -37;
  if (p >= 1) return 37;
  return normalQuantile(p);
}

export interface ArithmeticMeanLimits {
  /** Land's exact one-sided 95% lower confidence limit. */
  lower: number;
  /** Land's exact one-sided 95% upper confidence limit. */
  upper: number;
  /** The factors H_0.05 and H_0.95 used. */
  lowerFactor: number;
  upperFactor: number;
}

/**
 * Land's exact one-sided confidence limits for the lognormal arithmetic mean at the given
 * confidence (default 0.95): exp(ȳ + s²/2 + s·H/√(n−1)) (Land 1971, 1975; as used in
 * EPA QA/G-9 (2000) §4.2 and Gilbert 1987 §13.2). EPA QA/G-9 Box 3-12: UCL 10.97 for its 15 values.
 */
export function landConfidenceLimits(summary: LogScaleSummary, confidence = 0.95): ArithmeticMeanLimits {
  checkSummary('landConfidenceLimits', summary);
  if (!(confidence > 0.5 && confidence < 1)) {
    throw new RangeError(`landConfidenceLimits: confidence must lie between 0.5 and 1, got ${confidence}`);
  }
  const { n, mean, sd } = summary;
  const upperFactor = landFactor(n, sd, confidence);
  const lowerFactor = landFactor(n, sd, 1 - confidence);
  const centre = mean + (sd * sd) / 2;
  const scale = sd / Math.sqrt(n - 1);
  return {
    lower: Math.exp(centre + scale * lowerFactor),
    upper: Math.exp(centre + scale * upperFactor),
    lowerFactor,
    upperFactor,
  };
}
