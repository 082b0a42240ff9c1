import { describe, expect, it } from 'vitest';
import { gaussLegendreRule } from '@stats/gauss-legendre';
import { regularizedIncompleteBeta } from '@stats/incomplete-beta';
import { logGamma } from '@stats/log-gamma';
import { normalCdf, normalQuantile, Z_95 } from '@stats/normal-distribution';

// Expected values: R 4.2.2 (Debian r-base-core; lgamma, pbeta = TOMS 708, pnorm) and scipy 1.10.1
// (Debian python3-scipy), the call beside each. R rather than scipy for pbeta: scipy 1.10's
// betainc(11250.5, 2500, 0.818) = 0.4752963383071431 is off by 1.7e-11, R's agrees with 40-digit
// arithmetic. Tolerances are relative, 1e-13 to 1e-12: these functions feed the noncentral t, which
// must reach 1e-9 after summing hundreds of terms, so each piece needs several digits more.
const relative = (got: number, expected: number) => Math.abs(got / expected - 1);

describe('log-gamma (Stirling series with shift, A&S 6.1.40)', () => {
  it.each([
    [0.5, 0.57236494292470008], // R lgamma(0.5) = ln √π
    [1e-8, 18.420680738180209], // R lgamma(1e-8)
    [3.7, 1.4280723266653881], // R lgamma(3.7)
    [10, 12.801827480081469], // R lgamma(10) = ln 362880
    [12.5, 18.734347511936448], // R lgamma(12.5)
    [1e5, 1051287.7089736569], // R lgamma(1e5)
  ])('lnΓ(%f) = %f', (x, expected) => {
    expect(relative(logGamma(x), expected)).toBeLessThan(1e-13);
  });
});

describe('regularized incomplete beta (A&S 26.5.8 continued fraction)', () => {
  it.each([
    [0.5, 2, 3, 0.6875], // R pbeta(0.5, 2, 3), exact 11/16
    [0.3, 15.5, 12, 0.0021487170450191374], // R pbeta(0.3, 15.5, 12)
    [0.83, 40.5, 14.5, 0.95383387949386045], // R pbeta(0.83, 40.5, 14.5)
    [0.0015, 0.5, 2500, 0.99384679667672748], // R pbeta(0.0015, 0.5, 2500): one large parameter
    [0.818, 11250.5, 2500, 0.47529633831542695], // R pbeta(0.818, 11250.5, 2500): both large (ν 5000, δ 150)
  ])('I_%f(%f, %f) = %f', (x, a, b, expected) => {
    expect(relative(regularizedIncompleteBeta(x, a, b), expected)).toBeLessThan(1e-12);
  });
});

describe('normal distribution and Gauss–Legendre nodes', () => {
  it('Φ(1.96) = 0.97500210485177963 and Φ(−30) = 4.9067139271481872e-198 (R pnorm)', () => {
    expect(relative(normalCdf(1.96), 0.97500210485177963)).toBeLessThan(1e-15);
    // e^(−450): the rounding of x²/2 alone moves it by 450·2.2e-16 ≈ 1e-13, hence 1e-12.
    expect(relative(normalCdf(-30), 4.9067139271481872e-198)).toBeLessThan(1e-12);
  });

  it('Φ⁻¹(0.95) is the constant Z_95 = 1.6448536269514722 (scipy.stats.norm.ppf(0.95))', () => {
    expect(relative(normalQuantile(0.95), Z_95)).toBeLessThan(1e-15);
  });

  it('the 10-point rule integrates x^18 over [−1, 1] exactly, 2/19 (degree 2m − 1 exactness, A&S 25.4.29)', () => {
    const { nodes, weights } = gaussLegendreRule(10);
    const sum = nodes.reduce((total, x, i) => total + weights[i] * x ** 18, 0);
    expect(relative(sum, 2 / 19)).toBeLessThan(1e-13);
  });
});
