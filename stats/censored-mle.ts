/**
 * Maximum likelihood for a normal distribution with left-censored observations at one or several
 * detection limits, applied to the natural logs of shift results (a lognormal model).
 *
 * Method: Cohen, A. C. (1959), "Simplified estimators for the normal distribution when samples are
 * singly censored or truncated", Technometrics 1(3):217–237, and Cohen (1991), "Truncated and
 * Censored Samples", ch. 2–3 (the likelihood with censoring points); Helsel, D. R. (2012),
 * "Statistics for Censored Environmental Data Using Minitab and R", 2nd ed., ch. 6 (maximum
 * likelihood with several detection limits). The log-likelihood is
 *
 *   ℓ(μ, σ) = Σ_detected [−log σ − ½ log 2π − ½ z_i²] + Σ_non-detects log Φ(c_j),
 *   z_i = (y_i − μ)/σ,  c_j = (log DL_j − μ)/σ.
 *
 * Maximization: Newton–Raphson in Olsen's parameters δ = μ/σ, γ = 1/σ (Olsen, R. J. (1978),
 * "Note on the uniqueness of the maximum likelihood estimator for the Tobit model", Econometrica
 * 46:1211–1215). There each detected term log γ − ½(γy − δ)² is concave and each censored term
 * log Φ(γL − δ) is concave (Φ is log-concave, its argument is linear), so the log-likelihood is
 * concave and Newton's method with step halving climbs to the unique maximum from any start.
 *
 * Standard errors: the inverse of the observed information (minus the Hessian of ℓ) at the
 * maximum, in (μ, log σ), which is the parametrization and the variance that R's
 * survival::survreg reports (Therneau, survival package, `survreg`, `vcov`).
 */
import type { ShiftValue } from './types';
import { inverseMillsRatio, logNormalCdf } from './normal-tail';
import { censoredLogs, renamingRangeErrors } from './censored-sample';

const LOG_SQRT_TWO_PI = 0.5 * Math.log(2 * Math.PI);

/** Values on the model's scale: a plain array, or a typed array on hot paths such as the bootstrap. */
type Numbers = readonly number[] | Float64Array;

/** The maximum-likelihood fit of a left-censored normal sample. */
export interface CensoredNormalFit {
  /** Maximum-likelihood mean (on the log scale for `censoredLognormalMle`). */
  mu: number;
  /** Maximum-likelihood standard deviation (divisor n, as every MLE). */
  sigma: number;
  /** Log-likelihood at the maximum, including the −½·log 2π of each detected value. */
  logLikelihood: number;
  /** Standard error of mu from the observed information. */
  standardErrorMu: number;
  /** Standard error of log(sigma) from the observed information. */
  standardErrorLogSigma: number;
  /** Standard error of sigma by the delta method: sigma · SE(log sigma). */
  standardErrorSigma: number;
  /** Covariance of mu and log(sigma) from the observed information. */
  covarianceMuLogSigma: number;
  /** Newton iterations used. */
  iterations: number;
}

/** Options of the Newton–Raphson search; the defaults suit every sample we have tried. */
export interface CensoredMleOptions {
  /** Where to start (any start converges; a good one saves iterations). */
  start?: { mu: number; sigma: number };
  /** Iteration cap; reaching it throws a RangeError. Default 200. */
  maxIterations?: number;
}

/**
 * Log-likelihood ℓ(μ, σ) of a normal sample with detected values `detected` and non-detects known
 * only to lie below `censoredBelow` (Cohen 1991, ch. 2). Requires sigma > 0.
 */
export function censoredNormalLogLikelihood(mu: number, sigma: number, detected: readonly number[], censoredBelow: readonly number[]): number {
  if (!(sigma > 0) || !Number.isFinite(mu) || !Number.isFinite(sigma)) {
    throw new RangeError(`censoredNormalLogLikelihood: needs a finite mu and a sigma > 0, got mu ${mu}, sigma ${sigma}`);
  }
  let total = 0;
  for (const y of detected) {
    const z = (y - mu) / sigma;
    total += -Math.log(sigma) - LOG_SQRT_TWO_PI - 0.5 * z * z;
  }
  for (const limit of censoredBelow) total += logNormalCdf((limit - mu) / sigma);
  return total;
}

function checkFinite(name: string, list: Numbers, functionName: string): void {
  for (let i = 0; i < list.length; i++) {
    if (!Number.isFinite(list[i])) {
      throw new RangeError(`${functionName}: ${name}[${i}] must be a finite number, got ${list[i]}`);
    }
  }
}

/**
 * A sample reduced to what the likelihood needs: the detected values enter only through their
 * count, sum and sum of squares, and non-detects only through each distinct limit and how many
 * share it. One iteration then costs O(number of distinct limits), not O(n).
 */
interface ReducedSample {
  detectedCount: number;
  detectedSum: number;
  detectedSumSquares: number;
  limits: number[];
  limitCounts: number[];
}

/** Σz and Σz² of the detected values standardized as z = (y − center)/scale. */
function standardizedSums(detected: Numbers, center: number, scale: number): { sum: number; sumSquares: number } {
  let sum = 0;
  let sumSquares = 0;
  for (const y of detected) {
    const z = (y - center) / scale;
    sum += z;
    sumSquares += z * z;
  }
  return { sum, sumSquares };
}

function reduce(detected: Numbers, censoredBelow: Numbers, center: number, scale: number): ReducedSample {
  const { sum: detectedSum, sumSquares: detectedSumSquares } = standardizedSums(detected, center, scale);
  const sorted = Float64Array.from(censoredBelow).sort();
  const limits: number[] = [];
  const limitCounts: number[] = [];
  for (const limit of sorted) {
    const z = (limit - center) / scale;
    if (limits.length > 0 && limits[limits.length - 1] === z) limitCounts[limitCounts.length - 1] += 1;
    else {
      limits.push(z);
      limitCounts.push(1);
    }
  }
  return { detectedCount: detected.length, detectedSum, detectedSumSquares, limits, limitCounts };
}

/**
 * Olsen's concave log-likelihood, with its gradient and Hessian in (δ, γ):
 * detected part n·log γ − ½ Σ(γy − δ)², censored part Σ log Φ(γL − δ); d²/dc² log Φ(c) = −λ(c + λ).
 */
function olsenTerms(delta: number, gamma: number, sample: ReducedSample) {
  const { detectedCount: n, detectedSum: s1, detectedSumSquares: s2 } = sample;
  let value = n * Math.log(gamma) - 0.5 * (gamma * gamma * s2 - 2 * gamma * delta * s1 + n * delta * delta);
  let gradientDelta = gamma * s1 - n * delta;
  let gradientGamma = n / gamma - (gamma * s2 - delta * s1);
  let hessianDeltaDelta = -n;
  let hessianDeltaGamma = s1;
  let hessianGammaGamma = -n / (gamma * gamma) - s2;
  for (let j = 0; j < sample.limits.length; j++) {
    const limit = sample.limits[j];
    const count = sample.limitCounts[j];
    const c = gamma * limit - delta;
    const lambda = inverseMillsRatio(c);
    const w = lambda * (c + lambda); // lies in (0, 1)
    value += count * logNormalCdf(c);
    gradientDelta -= count * lambda;
    gradientGamma += count * lambda * limit;
    hessianDeltaDelta -= count * w;
    hessianDeltaGamma += count * w * limit;
    hessianGammaGamma -= count * w * limit * limit;
  }
  return { value, gradientDelta, gradientGamma, hessianDeltaDelta, hessianDeltaGamma, hessianGammaGamma };
}

function olsenValue(delta: number, gamma: number, sample: ReducedSample): number {
  const { detectedCount: n, detectedSum: s1, detectedSumSquares: s2 } = sample;
  let value = n * Math.log(gamma) - 0.5 * (gamma * gamma * s2 - 2 * gamma * delta * s1 + n * delta * delta);
  for (let j = 0; j < sample.limits.length; j++) {
    value += sample.limitCounts[j] * logNormalCdf(gamma * sample.limits[j] - delta);
  }
  return value;
}

/**
 * The maximum-likelihood estimate alone (no standard errors), for repeated use such as the
 * bootstrap in nondetects.ts. Same method, inputs and errors as censoredNormalMle.
 */
export function censoredNormalMleEstimate(
  detected: Numbers,
  censoredBelow: Numbers,
  options: CensoredMleOptions = {},
): { mu: number; sigma: number; iterations: number } {
  const functionName = 'censoredNormalMle';
  checkFinite('detected', detected, functionName);
  checkFinite('censoredBelow', censoredBelow, functionName);
  if (detected.length < 2) {
    throw new RangeError(`${functionName}: needs at least 2 detected values, got ${detected.length}`);
  }
  const n = detected.length;
  let mean = 0;
  for (const y of detected) mean += y;
  mean /= n;
  let sumSquares = 0;
  for (const y of detected) sumSquares += (y - mean) * (y - mean);
  const spread = Math.sqrt(sumSquares / (n - 1));
  if (!(spread > 0)) {
    throw new RangeError(`${functionName}: the detected values are all equal (${detected[0]}); their spread cannot be estimated`);
  }
  const maxIterations = options.maxIterations ?? 200;
  if (!Number.isInteger(maxIterations) || maxIterations < 1) {
    throw new RangeError(`${functionName}: maxIterations must be a positive integer, got ${maxIterations}`);
  }

  // Standardize with the detected values' mean and SD: the MLE is equivariant under y → a + b·y
  // (limits transformed alike), and unit-scale data keep the Newton system well conditioned.
  const sample = reduce(detected, censoredBelow, mean, spread);
  let startMu = 0;
  let startSigma = 1;
  if (options.start) {
    const { mu, sigma } = options.start;
    if (!Number.isFinite(mu) || !(sigma > 0) || !Number.isFinite(sigma)) {
      throw new RangeError(`${functionName}: start needs a finite mu and a finite sigma > 0, got mu ${mu}, sigma ${sigma}`);
    }
    startMu = (mu - mean) / spread;
    startSigma = sigma / spread;
  }
  let gamma = 1 / startSigma;
  let delta = startMu * gamma;

  let iterations = 0;
  let converged = false;
  while (iterations < maxIterations) {
    iterations += 1;
    const t = olsenTerms(delta, gamma, sample);
    const a = t.hessianDeltaDelta;
    const b = t.hessianDeltaGamma;
    const d = t.hessianGammaGamma;
    const determinant = a * d - b * b;
    let stepDelta: number;
    let stepGamma: number;
    if (a < 0 && determinant > 0) {
      // Newton step s = −H⁻¹g for the 2 × 2 negative-definite Hessian.
      stepDelta = -(d * t.gradientDelta - b * t.gradientGamma) / determinant;
      stepGamma = -(-b * t.gradientDelta + a * t.gradientGamma) / determinant;
    } else {
      // Round-off can spoil definiteness far from the maximum: fall back to a gradient step.
      stepDelta = t.gradientDelta / (1 + Math.abs(a));
      stepGamma = t.gradientGamma / (1 + Math.abs(d));
    }
    // Newton decrement: the rise of ℓ a full step predicts. Newton converges quadratically, so
    // once it falls below 1e-12·(1 + |ℓ|) one last full step lands on the maximum to rounding
    // error (the next decrement would be near 1e-24); comparing ℓ values that close is noise.
    const predictedRise = t.gradientDelta * stepDelta + t.gradientGamma * stepGamma;
    const roundingFloor = 1e-12 * (1 + Math.abs(t.value));
    if (predictedRise < roundingFloor && gamma + stepGamma > 0) {
      delta += stepDelta;
      gamma += stepGamma;
      converged = true;
      break;
    }
    let scale = 1;
    let accepted = false;
    for (let halving = 0; halving < 60; halving++) {
      const nextGamma = gamma + scale * stepGamma;
      if (nextGamma > 0) {
        const nextDelta = delta + scale * stepDelta;
        if (olsenValue(nextDelta, nextGamma, sample) > t.value) {
          delta = nextDelta;
          gamma = nextGamma;
          accepted = true;
          break;
        }
      }
      scale /= 2;
    }
    if (!accepted) {
      // No step along an ascent direction raises ℓ: only rounding stands between us and the top
      // if the predicted rise is tiny; otherwise something is wrong with the data.
      if (predictedRise < 1e-6 * (1 + Math.abs(t.value))) {
        converged = true;
        break;
      }
      throw new RangeError(`${functionName}: Newton–Raphson stalled before reaching the maximum`);
    }
  }
  if (!converged) {
    throw new RangeError(`${functionName}: Newton–Raphson did not converge in ${maxIterations} iterations`);
  }
  const mu = mean + spread * (delta / gamma);
  const sigma = spread / gamma;
  if (!Number.isFinite(mu) || !(sigma > 0) || !Number.isFinite(sigma)) {
    throw new RangeError(`${functionName}: the maximum is not finite (mu ${mu}, sigma ${sigma})`);
  }
  return { mu, sigma, iterations };
}

/**
 * Maximum-likelihood mean and standard deviation of a normal sample with left-censored values at
 * one or several limits (Cohen 1959, 1991; Helsel 2012, ch. 6), by Newton–Raphson in Olsen's
 * concave parametrization (Olsen 1978), with standard errors from the observed information.
 *
 * `detected` are the measured values, `censoredBelow` the limit of each non-detect, both on the
 * scale the normal model applies to (logs, for exposure data). Needs at least two different
 * detected values: with fewer the likelihood has no finite maximum when every limit lies above
 * the detected value.
 *
 * censoredNormalMle([0, 1, 2], []) → mu 1, sigma √(2/3) (the complete-data MLE, divisor n).
 */
export function censoredNormalMle(detected: readonly number[], censoredBelow: readonly number[], options: CensoredMleOptions = {}): CensoredNormalFit {
  const functionName = 'censoredNormalMle';
  const { mu, sigma, iterations } = censoredNormalMleEstimate(detected, censoredBelow, options);
  const information = observedInformation(mu, sigma, detected, censoredBelow);
  const determinant = information.muMu * information.logSigmaLogSigma - information.muLogSigma ** 2;
  if (!(information.muMu > 0 && determinant > 0)) {
    throw new RangeError(`${functionName}: the observed information is not positive definite at the maximum`);
  }
  const standardErrorLogSigma = Math.sqrt(information.muMu / determinant);
  return {
    mu,
    sigma,
    logLikelihood: censoredNormalLogLikelihood(mu, sigma, detected, censoredBelow),
    standardErrorMu: Math.sqrt(information.logSigmaLogSigma / determinant),
    standardErrorLogSigma,
    standardErrorSigma: sigma * standardErrorLogSigma,
    covarianceMuLogSigma: -information.muLogSigma / determinant,
    iterations,
  };
}

/**
 * Observed information −∂²ℓ in (μ, τ = log σ) (derived here from ℓ above; λ = φ/Φ, w = λ(c + λ)):
 *   −ℓ_μμ = (n_d + Σ w_j)/σ²
 *   −ℓ_μτ = ℓ_μ + (Σ z_i + Σ c_j w_j)/σ,      ℓ_μ = (Σ z_i − Σ λ_j)/σ
 *   −ℓ_ττ = 2 Σ z_i² − Σ (c_j λ_j − c_j² w_j)
 */
function observedInformation(mu: number, sigma: number, detected: readonly number[], censoredBelow: readonly number[]) {
  const { sum: sumZ, sumSquares: sumZSquared } = standardizedSums(detected, mu, sigma);
  let sumW = 0;
  let sumLambda = 0;
  let sumCW = 0;
  let sumTau = 0;
  for (const limit of censoredBelow) {
    const c = (limit - mu) / sigma;
    const lambda = inverseMillsRatio(c);
    const w = lambda * (c + lambda);
    sumW += w;
    sumLambda += lambda;
    sumCW += c * w;
    sumTau += c * lambda - c * c * w;
  }
  const gradientMu = (sumZ - sumLambda) / sigma;
  return {
    muMu: (detected.length + sumW) / (sigma * sigma),
    muLogSigma: gradientMu + (sumZ + sumCW) / sigma,
    logSigmaLogSigma: 2 * sumZSquared - sumTau,
  };
}

/**
 * Censored maximum likelihood for lognormal shift results: the normal MLE of the natural logs, a
 * non-detect contributing log Φ((log DL − μ)/σ) (Helsel 2012, ch. 6). Each value must be a finite
 * number > 0 (for a non-detect, its detection limit).
 */
export function censoredLognormalMle(values: readonly ShiftValue[], options: CensoredMleOptions = {}): CensoredNormalFit {
  const { detectedLogs, limitLogs } = censoredLogs(values, 'censoredLognormalMle');
  return renamingRangeErrors('censoredNormalMle', 'censoredLognormalMle', () => censoredNormalMle(detectedLogs, limitLogs, options));
}
