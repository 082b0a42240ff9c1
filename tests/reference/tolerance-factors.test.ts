import { describe, expect, it } from 'vitest';
import scipy from '../fixtures/stats/noncentral-t.json';
import rFixture from '../fixtures/stats/shapiro-wilk.json';
import { en689Ut } from '@stats/en689';
import { toleranceFactor } from '@stats/tolerance-limit';

describe('one-sided tolerance factor K(95 %, 95 %)', () => {
  // NIST/SEMATECH e-Handbook of Statistical Methods §7.2.6.3 and Natrella (1963), NBS Handbook 91,
  // Table A-7, as listed in REFERENCES.md. Printed to 3 decimals, so the tolerance is half a unit in
  // the last place (0.0005). For n = 6 the handbook tables print 3.707; K computed with z = 1.645 is
  // 3.7080 and with the exact z0.95 3.70768 — within the rounding either way.
  const table: [number, number][] = [
    [3, 7.656],
    [4, 5.144],
    [5, 4.203],
    [6, 3.708],
    [10, 2.911],
    [15, 2.566],
    [20, 2.396],
    [30, 2.22],
  ];
  it.each(table)('for n = %i equals the handbook value %f to the printed 3 decimals', (n, printed) => {
    expect(Math.abs(toleranceFactor(n) - printed)).toBeLessThanOrEqual(0.0005);
  });

  it(`matches scipy ${scipy.scipy} nct.ppf(0.95, n−1, z0.95√n)/√n to 1e-9 relative for n from 3 to 1000`, () => {
    for (const row of scipy.factors) expect(Math.abs(toleranceFactor(row.n) / row.k95_95 - 1), `n=${row.n}`).toBeLessThan(1e-9);
  });

  it(`matches R qt(0.95, n−1, z0.95√n)/√n to 1e-8 relative for n from 3 to 300 (${rFixture.R})`, () => {
    // 1e-8: R's qt with a noncentrality warns that full precision may not have been reached.
    for (const row of rFixture.factors) expect(Math.abs(toleranceFactor(row.n) / row.k95_95 - 1), `n=${row.n}`).toBeLessThan(1e-8);
  });
});

describe('EN 689:2018 UT values', () => {
  // EN 689:2018 Table F.1 as listed in REFERENCES.md ("computed; matches Table F.1 as remembered"),
  // 3 decimals, so half a unit in the last place.
  const table: [number, number][] = [
    [6, 2.187],
    [7, 2.12],
    [8, 2.072],
    [9, 2.035],
    [10, 2.005],
    [12, 1.961],
    [15, 1.917],
    [20, 1.87],
    [25, 1.841],
    [30, 1.82],
  ];
  it.each(table)('UT for n = %i equals Table F.1 value %f to 3 decimals', (n, printed) => {
    expect(Math.abs(en689Ut(n) - printed)).toBeLessThanOrEqual(0.0005);
  });

  it('matches scipy and R noncentral t quantiles at 70 % confidence (1e-9 and 1e-8 relative)', () => {
    for (const row of scipy.factors.filter((r) => r.n >= 6)) expect(Math.abs(en689Ut(row.n) / row.ut70 - 1), `scipy n=${row.n}`).toBeLessThan(1e-9);
    for (const row of rFixture.factors.filter((r) => r.n >= 6)) expect(Math.abs(en689Ut(row.n) / row.ut70 - 1), `R n=${row.n}`).toBeLessThan(1e-8);
  });
});
