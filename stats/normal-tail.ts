/**
 * The two lower-tail functions censored likelihoods need, accurate far into the tail: log Φ(x)
 * and the inverse Mills ratio λ(x) = φ(x)/Φ(x) (the derivative of log Φ).
 *
 * Above x = −30 both come from Φ(x) = ½·erfc(−x/√2) (Abramowitz & Stegun 1964, Handbook of
 * Mathematical Functions, 26.2.29, in normal-distribution.ts), which keeps full relative precision
 * in the lower tail. Below −30, where φ(x) nears the smallest double, the asymptotic series for
 * Mills' ratio is used (A&S 26.2.12): Φ(x) = φ(x)/t · (1 − 1/t² + 3/t⁴ − 15/t⁶ + 105/t⁸ − …),
 * t = −x; the first omitted term is below 945/30¹⁰ ≈ 2e-12 of the value.
 */
import { normalCdf, normalDensity } from './normal-distribution';

const LOG_SQRT_TWO_PI = 0.5 * Math.log(2 * Math.PI);
const ASYMPTOTIC_BELOW = -30;

/** The bracket (1 − 1/t² + 3/t⁴ − 15/t⁶ + 105/t⁸) of the asymptotic Mills-ratio series, t = −x. */
function millsSeries(x: number): number {
  const u = 1 / (x * x);
  return 1 - u * (1 - u * (3 - u * (15 - 105 * u)));
}

/**
 * log Φ(x), accurate for very negative x (Φ(−40) ≈ 3.7e-350 underflows; its log does not).
 * logNormalCdf(−10) → −53.23128515051247 (R: pnorm(−10, log.p = TRUE))
 */
export function logNormalCdf(x: number): number {
  if (Number.isNaN(x)) throw new RangeError('logNormalCdf: x must be a number, got NaN');
  if (x >= ASYMPTOTIC_BELOW) return Math.log(normalCdf(x));
  return -0.5 * x * x - LOG_SQRT_TWO_PI - Math.log(-x) + Math.log(millsSeries(x));
}

/**
 * Inverse Mills ratio for left-censoring, λ(x) = φ(x)/Φ(x). Tends to −x as x → −∞ and to 0 as
 * x → +∞. inverseMillsRatio(0) → 0.7978845608028654 (= 2φ(0))
 */
export function inverseMillsRatio(x: number): number {
  if (Number.isNaN(x)) throw new RangeError('inverseMillsRatio: x must be a number, got NaN');
  if (x >= ASYMPTOTIC_BELOW) return normalDensity(x) / normalCdf(x);
  return -x / millsSeries(x);
}
