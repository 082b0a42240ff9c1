import { normalCdf, normalQuantile } from './normal-distribution';

/**
 * Shapiro–Wilk W test of normality for 3 ≤ n ≤ 5000.
 *
 * Method: Shapiro & Wilk (1965), "An analysis of variance test for normality (complete samples)",
 * Biometrika 52:591–611, with the approximations of Royston (1995), "Remark AS R94: A remark on
 * algorithm AS 181: the W-test for normality", Applied Statistics 44:547–551:
 * - m_i = Φ⁻¹((i − 3/8)/(n + 1/4)) (Blom scores), c = m/‖m‖, u = 1/√n;
 * - a_n = c_n + 0.221157u − 0.147981u² − 2.071190u³ + 4.434685u⁴ − 2.706056u⁵,
 *   and for n > 5 also a_{n−1} = c_{n−1} + 0.042981u − 0.293762u² − 1.752461u³ + 5.682633u⁴ − 3.582633u⁵;
 *   the other coefficients are m_i/√ε with ε chosen so that Σa² = 1; a is antisymmetric; n = 3 uses
 *   the exact a_3 = √½;
 * - W = (Σ a_i x_(i))² / Σ(x_i − x̄)²;
 * - p: for n = 3 the exact P = (6/π)(arcsin √W − arcsin √¾); for 4 ≤ n ≤ 11,
 *   −ln(γ − ln(1 − W)) is normal with γ = −2.273 + 0.459n, mean 0.5440 − 0.39978n + 0.025054n² −
 *   0.0006714n³ and SD exp(1.3822 − 0.77857n + 0.062767n² − 0.0020322n³); for 12 ≤ n ≤ 5000,
 *   ln(1 − W) is normal with mean −1.5861 − 0.31082x − 0.083751x² + 0.0038915x³ and SD
 *   exp(−0.4803 − 0.082676x + 0.0030302x²), x = ln n. The p-value is the upper tail.
 * Checked against R's shapiro.test (tests/fixtures/stats/shapiro-wilk.json).
 */

export interface ShapiroWilkResult {
  /** The W statistic, 0 < W ≤ 1; small W means evidence against normality. */
  w: number;
  /** The p-value of the test (upper tail of the transformed statistic). */
  p: number;
}

/** p(u) = c0 + c1·u + c2·u² + … by Horner's rule. */
function polynomial(coefficients: readonly number[], u: number): number {
  let result = 0;
  for (let i = coefficients.length - 1; i >= 0; i--) result = result * u + coefficients[i];
  return result;
}

const LAST_COEFFICIENT = [0, 0.221157, -0.147981, -2.07119, 4.434685, -2.706056];
const SECOND_LAST_COEFFICIENT = [0, 0.042981, -0.293762, -1.752461, 5.682633, -3.582633];
const SMALL_GAMMA = [-2.273, 0.459];
const SMALL_MEAN = [0.544, -0.39978, 0.025054, -6.714e-4];
const SMALL_LOG_SD = [1.3822, -0.77857, 0.062767, -0.0020322];
const LARGE_MEAN = [-1.5861, -0.31082, -0.083751, 0.0038915];
const LARGE_LOG_SD = [-0.4803, -0.082676, 0.0030302];

/**
 * The coefficients a_{n−i+1} = −a_i for i = 1…⌊n/2⌋, i.e. the weights of the upper half, largest first.
 * shapiroWilkCoefficients(3) → [0.7071067811865476]
 */
export function shapiroWilkCoefficients(n: number): number[] {
  if (!Number.isInteger(n) || n < 3 || n > 5000) {
    throw new RangeError(`shapiroWilkCoefficients: n must be an integer from 3 to 5000, got ${n}`);
  }
  const half = Math.floor(n / 2);
  if (n === 3) return [Math.SQRT1_2];
  // Blom scores of the upper half, largest first: m_{n−i+1} = −Φ⁻¹((i − 3/8)/(n + 1/4)).
  const scores = new Array<number>(half);
  let sumOfSquares = 0;
  for (let i = 0; i < half; i++) {
    scores[i] = -normalQuantile((i + 1 - 0.375) / (n + 0.25));
    sumOfSquares += scores[i] * scores[i];
  }
  sumOfSquares *= 2; // the lower half mirrors the upper; a middle score (odd n) is 0
  const norm = Math.sqrt(sumOfSquares);
  const u = 1 / Math.sqrt(n);
  const a = new Array<number>(half);
  a[0] = scores[0] / norm + polynomial(LAST_COEFFICIENT, u);
  let first: number;
  let epsilon: number;
  if (n > 5) {
    a[1] = scores[1] / norm + polynomial(SECOND_LAST_COEFFICIENT, u);
    epsilon = (sumOfSquares - 2 * scores[0] ** 2 - 2 * scores[1] ** 2) / (1 - 2 * a[0] ** 2 - 2 * a[1] ** 2);
    first = 2;
  } else {
    epsilon = (sumOfSquares - 2 * scores[0] ** 2) / (1 - 2 * a[0] ** 2);
    first = 1;
  }
  const scale = Math.sqrt(epsilon);
  for (let i = first; i < half; i++) a[i] = scores[i] / scale;
  return a;
}

/**
 * Shapiro–Wilk test (method in the file comment). Values need not be sorted; they must be finite
 * and not all equal. shapiroWilk([148, 154, 158, 160, 161, 162, 166, 170, 182, 195, 236])
 * → { w: 0.7888, p: 0.0067 } (REFERENCES.md; R shapiro.test).
 */
export function shapiroWilk(values: readonly number[]): ShapiroWilkResult {
  const n = values.length;
  if (n < 3 || n > 5000) throw new RangeError(`shapiroWilk: needs from 3 to 5000 values, got ${n}`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(values[i])) throw new RangeError(`shapiroWilk: value ${i + 1} is not a finite number (${values[i]})`);
  }
  const x = [...values].sort((p, q) => p - q);
  if (x[0] === x[n - 1]) throw new RangeError('shapiroWilk: all values are equal, so normality cannot be tested');
  const a = shapiroWilkCoefficients(n);
  let mean = 0;
  for (const value of x) mean += value;
  mean /= n;
  let sumOfSquares = 0;
  for (const value of x) sumOfSquares += (value - mean) ** 2;
  let numerator = 0;
  for (let i = 0; i < a.length; i++) numerator += a[i] * (x[n - 1 - i] - x[i]);
  const w = Math.min(1, (numerator * numerator) / sumOfSquares);

  if (n === 3) {
    // Exact distribution for n = 3 (Shapiro & Wilk 1965, §4; Royston 1995).
    const p = (6 / Math.PI) * (Math.asin(Math.sqrt(w)) - Math.asin(Math.sqrt(0.75)));
    return { w, p: Math.min(1, Math.max(0, p)) };
  }
  const logOneMinusW = Math.log(1 - w);
  let y: number;
  let mu: number;
  let sigma: number;
  if (n <= 11) {
    const gamma = polynomial(SMALL_GAMMA, n);
    // Beyond γ the transformation is undefined: the p-value is below anything it can express.
    if (logOneMinusW >= gamma) return { w, p: 0 };
    y = -Math.log(gamma - logOneMinusW);
    mu = polynomial(SMALL_MEAN, n);
    sigma = Math.exp(polynomial(SMALL_LOG_SD, n));
  } else {
    const logN = Math.log(n);
    y = logOneMinusW;
    mu = polynomial(LARGE_MEAN, logN);
    sigma = Math.exp(polynomial(LARGE_LOG_SD, logN));
  }
  return { w, p: normalCdf(-(y - mu) / sigma) };
}
