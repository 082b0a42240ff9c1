import { describe, expect, it } from 'vitest';
import { censoredLognormalMle, censoredNormalLogLikelihood, censoredNormalMle, censoredNormalMleEstimate } from '../../../stats/censored-mle';

// Hand-made sample: logs with two detection limits (several detected values lie between them).
const detected = [-1.2, -0.4, 0.1, 0.35, 0.9, 1.6, -0.8, 0.05];
const censoredBelow = [-1.0, -1.0, -0.5, -1.0, -0.5];

describe('censoredNormalMle', () => {
  it('without non-detects gives the sample mean and the SD with divisor n (the complete-data MLE)', () => {
    // Definition of the normal MLE: mean 1, variance ((−1)² + 0² + 1²)/3 = 2/3.
    const fit = censoredNormalMle([0, 1, 2], []);
    expect(fit.mu).toBeCloseTo(1, 12);
    expect(fit.sigma).toBeCloseTo(Math.sqrt(2 / 3), 12);
    // Complete data: Var(mu) = sigma²/n and Var(log sigma) = 1/(2n) from the observed information.
    expect(fit.standardErrorMu).toBeCloseTo(Math.sqrt(2 / 3 / 3), 12);
    expect(fit.standardErrorLogSigma).toBeCloseTo(Math.sqrt(1 / 6), 12);
  });

  it("reaches the same maximum from far-off starting points (the likelihood is concave in Olsen's parameters)", () => {
    const reference = censoredNormalMle(detected, censoredBelow);
    for (const start of [
      { mu: 25, sigma: 0.01 },
      { mu: -30, sigma: 50 },
      { mu: 0, sigma: 1e-4 },
    ]) {
      const fit = censoredNormalMleEstimate(detected, censoredBelow, { start });
      expect(Math.abs(fit.mu - reference.mu)).toBeLessThan(1e-9);
      expect(Math.abs(fit.sigma / reference.sigma - 1)).toBeLessThan(1e-9);
    }
  });

  it('sits where the log-likelihood is highest: any small move lowers it', () => {
    const fit = censoredNormalMle(detected, censoredBelow);
    const top = censoredNormalLogLikelihood(fit.mu, fit.sigma, detected, censoredBelow);
    expect(top).toBeCloseTo(fit.logLikelihood, 12);
    for (const [dm, ds] of [
      [1e-3, 0],
      [-1e-3, 0],
      [0, 1e-3],
      [0, -1e-3],
    ]) {
      expect(censoredNormalLogLikelihood(fit.mu + dm, fit.sigma + ds, detected, censoredBelow)).toBeLessThan(top);
    }
  });

  it('has standard errors equal to the inverse of a finite-difference Hessian of the log-likelihood', () => {
    const fit = censoredNormalMle(detected, censoredBelow);
    const ell = (mu: number, logSigma: number) => censoredNormalLogLikelihood(mu, Math.exp(logSigma), detected, censoredBelow);
    const h = 1e-4;
    const m = fit.mu;
    const t = Math.log(fit.sigma);
    const hmm = (ell(m + h, t) - 2 * ell(m, t) + ell(m - h, t)) / (h * h);
    const htt = (ell(m, t + h) - 2 * ell(m, t) + ell(m, t - h)) / (h * h);
    const hmt = (ell(m + h, t + h) - ell(m + h, t - h) - ell(m - h, t + h) + ell(m - h, t - h)) / (4 * h * h);
    const determinant = hmm * htt - hmt * hmt;
    // Central differences with h = 1e-4 are accurate to about h² relative: 1e-5 is ample.
    expect(Math.abs(fit.standardErrorMu ** 2 / (-htt / determinant) - 1)).toBeLessThan(1e-5);
    expect(Math.abs(fit.standardErrorLogSigma ** 2 / (-hmm / determinant) - 1)).toBeLessThan(1e-5);
    expect(Math.abs(fit.covarianceMuLogSigma / (hmt / determinant) - 1)).toBeLessThan(1e-5);
  });

  it('shifts mu by log(c) and keeps sigma when every result and limit is multiplied by c', () => {
    const values = [0.3, 0.12, 0.5, 0.08, 0.9, 0.21, 0.15].map((value, i) => ({ value, nonDetect: i === 3 || i === 1 }));
    const base = censoredLognormalMle(values);
    const scaled = censoredLognormalMle(values.map((v) => ({ ...v, value: v.value * 1000 })));
    expect(scaled.mu - base.mu).toBeCloseTo(Math.log(1000), 10);
    expect(scaled.sigma / base.sigma).toBeCloseTo(1, 10);
    expect(scaled.standardErrorMu / base.standardErrorMu).toBeCloseTo(1, 8);
  });

  it('refuses fewer than 2 detected values, equal detected values and non-numbers with clear RangeErrors', () => {
    expect(() => censoredNormalMle([1], [0, 0])).toThrow(/censoredNormalMle: needs at least 2 detected values, got 1/);
    expect(() => censoredNormalMle([1, 1, 1], [0])).toThrow(/censoredNormalMle: the detected values are all equal/);
    expect(() => censoredNormalMle([1, Number.NaN], [])).toThrow(/censoredNormalMle: detected\[1\] must be a finite number/);
    expect(() => censoredNormalMle([1, 2], [Infinity])).toThrow(/censoredNormalMle: censoredBelow\[0\] must be a finite number/);
    expect(() => censoredNormalMle([1, 2], [], { start: { mu: 0, sigma: 0 } })).toThrow(/start needs a finite mu and a finite sigma > 0/);
    expect(() => censoredNormalMle([1, 2], [], { maxIterations: 0 })).toThrow(/maxIterations must be a positive integer/);
  });

  it('says so when the iteration cap is reached before convergence', () => {
    expect(() => censoredNormalMle(detected, censoredBelow, { start: { mu: 40, sigma: 0.01 }, maxIterations: 2 })).toThrow(
      /censoredNormalMle: Newton–Raphson did not converge in 2 iterations/,
    );
  });

  it('refuses a shift result or detection limit that is not > 0, naming the result', () => {
    expect(() =>
      censoredLognormalMle([
        { value: 1, nonDetect: false },
        { value: 2, nonDetect: false },
        { value: 0, nonDetect: true },
      ]),
    ).toThrow(/censoredLognormalMle: result 3 has detection limit 0; it must be a finite number > 0/);
    expect(() => censoredLognormalMle([{ value: -1, nonDetect: false }])).toThrow(/result 1 has value -1/);
  });
});

describe('censoredNormalLogLikelihood', () => {
  it('adds log densities of detected values and log Φ at each limit (Cohen 1991)', () => {
    // By hand: detected 0 at N(0, 1): −½·log 2π; a non-detect below 0: log Φ(0) = log ½.
    expect(censoredNormalLogLikelihood(0, 1, [0], [0])).toBeCloseTo(-0.5 * Math.log(2 * Math.PI) + Math.log(0.5), 14);
  });

  it('refuses a sigma that is not > 0', () => {
    expect(() => censoredNormalLogLikelihood(0, 0, [1], [])).toThrow(/censoredNormalLogLikelihood: needs a finite mu and a sigma > 0/);
  });
});
