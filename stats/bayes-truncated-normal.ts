import erfc from '@stdlib/math-base-special-erfc';
import type { RandomSource } from './random';

/**
 * Draws from the standard normal distribution truncated to (lower, upper), the building block of
 * the data-augmentation step of the Bayesian view (censored logs are imputed from truncated normals).
 *
 * Method: inversion of the cumulative distribution (Devroye 1986, "Non-Uniform Random Variate
 * Generation", section II.2.2), done on the side of zero where the truncation probabilities keep full
 * relative precision: Φ(a), Φ(b) below zero, Q(a) = 1 − Φ(a), Q(b) above zero. Φ comes from @stdlib's
 * erfc (a port of the FreeBSD double-precision algorithm) and Φ⁻¹ from Wichura's AS 241, both accurate
 * to a few ulps also deep in the tails. Where both truncation probabilities underflow (a bound more than about
 * 37 standard deviations out) inversion is impossible and the exact rejection samplers of Robert (1995),
 * "Simulation of truncated normal variables", Statistics and Computing 5:121–125 (one-sided: translated
 * exponential proposal with rate (α + √(α² + 4))/2, section 2.1; two-sided: uniform proposal, section 2.2)
 * take over. Every path is exact, not an approximation.
 */
export function truncatedStandardNormal(random: RandomSource, lower: number, upper: number): number {
  if (!(lower < upper) || Number.isNaN(lower) || Number.isNaN(upper)) {
    throw new RangeError(`truncatedStandardNormal: lower must be below upper, got (${lower}, ${upper})`);
  }
  const plan = new TruncationPlan();
  plan.prepare(lower, upper);
  return plan.draw(random);
}

const SQRT2 = Math.SQRT2;
/** Below this probability the inversion loses relative precision (erfc underflows near 1e-308). */
const TINY_PROBABILITY = 1e-290;

const METHOD_INVERT = 0;
const METHOD_EXPONENTIAL_UPPER_TAIL = 2;
const METHOD_EXPONENTIAL_LOWER_TAIL = 3;
const METHOD_UNIFORM = 4;

/**
 * The per-iteration part of truncated-normal sampling that depends only on the bounds: the Gibbs sampler
 * prepares one plan per distinct (lower, upper) pair of standardized bounds and draws all censored
 * results that share those bounds from it, so Φ is evaluated once per detection limit and iteration.
 * Mutable and reusable, so the sampling loop allocates nothing.
 */
export class TruncationPlan {
  private method = METHOD_INVERT;
  /** True when draws are z = sign·Φ⁻¹(base + U·width); the Gibbs loop inlines this common case. */
  inverts = true;
  base = 0;
  width = 1;
  sign = 1;
  private lower = 0;
  private upper = 0;
  private rate = 1;

  /** Prepare for draws on (lower, upper); either bound may be infinite, lower < upper. */
  prepare(lower: number, upper: number): void {
    this.lower = lower;
    this.upper = upper;
    if (lower >= 0) {
      // Entirely in the upper half: invert the upper tail Q(x) = erfc(x/√2)/2.
      const qLower = 0.5 * erfc(lower / SQRT2);
      const qUpper = upper === Infinity ? 0 : 0.5 * erfc(upper / SQRT2);
      if (qLower > TINY_PROBABILITY && qLower - qUpper > 1e-12 * qLower) {
        this.setInversion(qUpper, qLower - qUpper, -1);
        return;
      }
      this.chooseRejection(lower, upper, false);
      return;
    }
    const pLower = lower === -Infinity ? 0 : 0.5 * erfc(-lower / SQRT2);
    const pUpper = 0.5 * erfc(-upper / SQRT2);
    if (pUpper > TINY_PROBABILITY && pUpper - pLower > 1e-12 * pUpper) {
      this.setInversion(pLower, pUpper - pLower, 1);
      return;
    }
    this.chooseRejection(lower, upper, true);
  }

  private setInversion(base: number, width: number, sign: number): void {
    this.method = METHOD_INVERT;
    this.inverts = true;
    this.base = base;
    this.width = width;
    this.sign = sign;
  }

  /** Far-tail fallbacks (Robert 1995). `mirrored`: the interval lies in the lower tail. */
  private chooseRejection(lower: number, upper: number, mirrored: boolean): void {
    // Work with the tail bound nearest zero, α ≥ 0, and the far bound β (possibly infinite).
    const alpha = mirrored ? -upper : lower;
    const beta = mirrored ? -lower : upper;
    this.inverts = false;
    if ((beta - alpha) * alpha < 1) {
      this.method = METHOD_UNIFORM;
      return;
    }
    this.method = mirrored ? METHOD_EXPONENTIAL_LOWER_TAIL : METHOD_EXPONENTIAL_UPPER_TAIL;
    this.rate = (alpha + Math.sqrt(alpha * alpha + 4)) / 2;
  }

  /** One draw from the prepared truncated standard normal. */
  draw(random: RandomSource): number {
    switch (this.method) {
      case METHOD_INVERT:
        return this.sign * inverseStandardNormal(this.base + random.uniform() * this.width);
      case METHOD_EXPONENTIAL_UPPER_TAIL:
        return this.exponentialTail(random, this.lower, this.upper);
      case METHOD_EXPONENTIAL_LOWER_TAIL:
        return -this.exponentialTail(random, -this.upper, -this.lower);
      default:
        return this.uniformProposal(random);
    }
  }

  /** Robert (1995) section 2.1: z = α + Exp(λ), accepted with probability exp(−(z − λ)²/2); rejects z > β. */
  private exponentialTail(random: RandomSource, alpha: number, beta: number): number {
    const rate = this.rate;
    for (;;) {
      const z = alpha - Math.log(random.uniform()) / rate;
      if (z >= beta) continue;
      const d = z - rate;
      if (Math.log(random.uniform()) <= -0.5 * d * d) return z;
    }
  }

  /** Robert (1995) section 2.2: uniform proposal on (a, b), accepted with probability ϱ(z) relative to the bound nearest zero. */
  private uniformProposal(random: RandomSource): number {
    const a = this.lower;
    const b = this.upper;
    const nearest = a > 0 ? a : b < 0 ? b : 0;
    for (;;) {
      const z = a + (b - a) * random.uniform();
      if (Math.log(random.uniform()) <= 0.5 * (nearest * nearest - z * z)) return z;
    }
  }
}

/**
 * Φ⁻¹(p), the standard normal quantile, by Wichura (1988), "Algorithm AS 241: The percentage points of
 * the normal distribution", Applied Statistics 37:477–484 (PPND16, relative error about 1e-16; the
 * algorithm behind R's qnorm). Used in the sampling loop, so written with Math.log/Math.sqrt only.
 */
// The coefficients are printed as in AS 241 (20 significant digits); the doubles they round to are what
// the algorithm uses, so the literal's extra digits are kept for checking against the paper.
/* eslint-disable no-loss-of-precision */
export function inverseStandardNormal(p: number): number {
  const q = p - 0.5;
  if (Math.abs(q) > 0.425) return inverseStandardNormalTail(p, q);
  {
    const r = 0.180625 - q * q;
    return (
      (q *
        (((((((2.5090809287301226727e3 * r + 3.3430575583588128105e4) * r + 6.7265770927008700853e4) * r + 4.5921953931549871457e4) * r +
          1.3731693765509461125e4) *
          r +
          1.9715909503065514427e3) *
          r +
          1.3314166789178437745e2) *
          r +
          3.387132872796366608)) /
      (((((((5.226495278852854561e3 * r + 2.8729085735721942674e4) * r + 3.930789580009271061e4) * r + 2.1213794301586595867e4) * r + 5.3941960214247511077e3) *
        r +
        6.871870074920579083e2) *
        r +
        4.2313330701600911252e1) *
        r +
        1)
    );
  }
}

/** The tails of AS 241 (|p − 0.5| > 0.425), kept apart so the central part stays small enough to inline. */
function inverseStandardNormalTail(p: number, q: number): number {
  let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
  let x: number;
  if (r <= 5) {
    r -= 1.6;
    x =
      (((((((7.7454501427834140764e-4 * r + 2.27238449892691845833e-2) * r + 2.4178072517745061177e-1) * r + 1.27045825245236838258) * r +
        3.64784832476320460504) *
        r +
        5.7694972214606914055) *
        r +
        4.6303378461565452959) *
        r +
        1.42343711074968357734) /
      (((((((1.05075007164441684324e-9 * r + 5.475938084995344946e-4) * r + 1.51986665636164571966e-2) * r + 1.4810397642748007459e-1) * r +
        6.8976733498510000455e-1) *
        r +
        1.6763848301838038494) *
        r +
        2.05319162663775882187) *
        r +
        1);
  } else {
    r -= 5;
    x =
      (((((((2.01033439929228813265e-7 * r + 2.71155556874348757815e-5) * r + 1.2426609473880784386e-3) * r + 2.6532189526576123093e-2) * r +
        2.9656057182850489123e-1) *
        r +
        1.7848265399172913358) *
        r +
        5.4637849111641143699) *
        r +
        6.6579046435011037772) /
      (((((((2.04426310338993978564e-15 * r + 1.4215117583164458887e-7) * r + 1.8463183175100546818e-5) * r + 7.868691311456132591e-4) * r +
        1.48753612908506148525e-2) *
        r +
        1.3692988092273580531e-1) *
        r +
        5.9983220655588793769e-1) *
        r +
        1);
  }
  return q < 0 ? -x : x;
}
/* eslint-enable no-loss-of-precision */
