/**
 * Censored maximum likelihood against R's survival::survreg.
 * Fixture: tests/fixtures/stats/censored-mle.json, written by tests/fixtures/stats/generate-censored.R
 * (fixed seeds; R and survival versions recorded in the fixture), fitting
 * survreg(Surv(log(value), !nonDetect, type = "left") ~ 1, dist = "gaussian").
 */
import { describe, expect, it } from 'vitest';
import fixture from '../fixtures/stats/censored-mle.json';
import { censoredLognormalMle } from '../../stats/censored-mle';

// Both programs run Newton–Raphson to convergence (survreg with rel.tolerance 1e-13); the
// estimates agreed to about 1e-12 when this was written. 1e-8 relative leaves room for platform
// differences in pnorm/erfc while still catching any real error in the likelihood, its
// derivatives or the information matrix (which would show at 1e-3 or more).
const RELATIVE = 1e-8;

function closeTo(actual: number, expected: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(RELATIVE * Math.abs(expected));
}

describe('censored maximum likelihood matches survival::survreg', () => {
  it('the fixture records the R and survival versions it was made with', () => {
    expect(fixture.r).toMatch(/^R version \d+\.\d+\.\d+/);
    expect(fixture.survival).toMatch(/^\d+\.\d+/);
    expect(fixture.cases.length).toBeGreaterThanOrEqual(6);
    expect(new Set(fixture.cases.map((c) => c.nonDetect.filter(Boolean).length > 0)).has(true)).toBe(true);
  });

  for (const c of fixture.cases) {
    describe(c.name, () => {
      const values = c.values.map((value, i) => ({ value, nonDetect: c.nonDetect[i] }));
      const fit = censoredLognormalMle(values);

      it("gives survreg's intercept (mu) and scale (sigma) of the log values", () => {
        closeTo(fit.mu, c.mu); // survreg coef(fit)[1]
        closeTo(fit.sigma, c.sigma); // survreg fit$scale
      });

      it("gives survreg's log-likelihood at the maximum", () => {
        closeTo(fit.logLikelihood, c.logLikelihood); // survreg fit$loglik[2]
      });

      it("gives survreg's variances of mu and log(sigma) from the observed information", () => {
        closeTo(fit.standardErrorMu ** 2, c.varianceMu); // vcov(fit)[1, 1]
        closeTo(fit.standardErrorLogSigma ** 2, c.varianceLogSigma); // vcov(fit)[2, 2]
        closeTo(fit.covarianceMuLogSigma, c.covarianceMuLogSigma); // vcov(fit)[1, 2]
        closeTo(fit.standardErrorSigma, fit.sigma * Math.sqrt(c.varianceLogSigma)); // delta method
      });
    });
  }
});
