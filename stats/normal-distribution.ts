import erfc from '@stdlib/math-base-special-erfc';
import erfcinv from '@stdlib/math-base-special-erfcinv';

/**
 * The standard normal distribution, written on the complementary error function so that both
 * tails keep full relative precision: Φ(x) = ½·erfc(−x/√2) (Abramowitz & Stegun 1964, eq. 26.2.29).
 * erfc and its inverse come from @stdlib (a port of the FreeBSD/Sun erfc and of Boost's erfc_inv,
 * both accurate to a few units in the last place); everything else here is the textbook identity.
 */

const SQRT_2 = Math.SQRT2;
const LOG_SQRT_2_PI = 0.9189385332046728;

/** The 95th percentile of the standard normal, Φ⁻¹(0.95). Printed tables round it to 1.645. */
export const Z_95 = 1.6448536269514722;

/**
 * Standard normal cumulative distribution function Φ(x) = P(Z ≤ x), accurate in relative terms in
 * the lower tail (Φ(−30) ≈ 4.9e−198 is returned with full precision).
 * Method: Φ(x) = ½·erfc(−x/√2) (Abramowitz & Stegun 1964, eq. 26.2.29).  normalCdf(1.96) → 0.9750021048517795
 */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) throw new RangeError('normalCdf: x must be a number, got NaN');
  return 0.5 * erfc(-x / SQRT_2);
}

/** Standard normal density φ(x) = exp(−x²/2)/√(2π) (Abramowitz & Stegun 1964, eq. 26.2.1). */
export function normalDensity(x: number): number {
  if (Number.isNaN(x)) throw new RangeError('normalDensity: x must be a number, got NaN');
  return Math.exp(-0.5 * x * x - LOG_SQRT_2_PI);
}

/**
 * Standard normal quantile Φ⁻¹(p) for 0 < p < 1.
 * Method: Φ⁻¹(p) = −√2·erfc⁻¹(2p) (inverse of Abramowitz & Stegun 1964, eq. 26.2.29).
 * normalQuantile(0.975) → 1.959963984540054
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normalQuantile: p must lie strictly between 0 and 1, got ${p}`);
  return -SQRT_2 * erfcinv(2 * p);
}
