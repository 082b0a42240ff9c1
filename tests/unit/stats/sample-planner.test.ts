/**
 * Sample planner: forecasts, recommendation, statement, reproducibility and refusals.
 *
 * Sources: the classical judgement rule of stats/judgement.ts (UTL95%,95% ≤ OEL acceptable, P95 estimate
 * > OEL unacceptable); posterior predictive simulation (Gelman et al. 2013, section 6.3), checked here
 * against a brute-force re-computation of the same futures through the classical engine's own
 * logScaleSummary, percentile95 and upperToleranceLimit. Data are invented.
 */
import { describe, expect, test } from 'vitest';
import { samplePlanner } from '@stats/sample-planner';
import { sampleLognormalPosterior } from '@stats/bayes-gibbs';
import { logScaleSummary } from '@stats/log-scale-summary';
import { percentile95, upperToleranceLimit } from '@stats/tolerance-limit';
import { classicalJudgement } from '@stats/judgement';
import { createRandom } from '@stats/random';
import type { ShiftValue } from '@stats/types';

const detected = (values: number[]): ShiftValue[] => values.map((value) => ({ value, nonDetect: false }));
// Five results whose P95 estimate is below the OEL of 1 but whose UTL is above it: uncertain.
const UNCERTAIN = detected([0.12, 0.2, 0.09, 0.3, 0.16]);

describe('samplePlanner', () => {
  test('for an uncertain group it forecasts k = 1..12, recommends the first k reaching 80 % and says it is a forecast', () => {
    const plan = samplePlanner(UNCERTAIN, { oel: 1, seed: 7 });
    expect(plan.currentJudgement).toBe('uncertain');
    expect(plan.forecasts.map((f) => f.additional)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    for (const f of plan.forecasts) {
      expect(f.probabilitySettled).toBeCloseTo(f.probabilityAcceptable + f.probabilityUnacceptable, 12);
    }
    const first = plan.forecasts.find((f) => f.probabilitySettled >= 0.8);
    expect(plan.recommendedAdditional).toBe(first ? first.additional : null);
    expect(plan.forecasts[11].probabilitySettled).toBeGreaterThan(plan.forecasts[0].probabilitySettled);
    if (plan.recommendedAdditional !== null) {
      const pct = Math.round(plan.forecasts[plan.recommendedAdditional - 1].probabilitySettled * 100);
      const article = pct === 8 || pct === 11 || pct === 18 || (pct >= 80 && pct <= 89) ? 'an' : 'a';
      expect(plan.statement).toBe(
        `With ${plan.recommendedAdditional} more shift${plan.recommendedAdditional === 1 ? '' : 's'} there is ${article} ${pct} % chance that the group's judgement will be settled (acceptable or unacceptable); this is a forecast from the current data, not a promise.`,
      );
    } else {
      expect(plan.statement).toMatch(/more than 12 would likely be needed; this is a forecast from the current data, not a promise\.$/);
    }
  });

  test('its forecasts agree with a brute-force re-judging of the same kind of futures through the classical engine', () => {
    const plan = samplePlanner(UNCERTAIN, { oel: 1, seed: 7, maxAdditional: 4 });
    const draws = sampleLognormalPosterior(UNCERTAIN, { settings: { seed: 8 } });
    const random = createRandom(99);
    const settled = [0, 0, 0, 0, 0];
    const runs = 2_000;
    for (let s = 0; s < runs; s++) {
      const j = random.integer(draws.mu.length);
      const values = UNCERTAIN.map((v) => v.value);
      for (let k = 1; k <= 4; k++) {
        values.push(Math.exp(draws.mu[j] + draws.sigma[j] * random.normal()));
        const summary = logScaleSummary(values);
        const verdict = classicalJudgement({ p95: percentile95(summary), utl95_95: upperToleranceLimit(summary), oel: 1 });
        if (verdict !== 'uncertain') settled[k]++;
      }
    }
    // Two independent 2,000-run estimates of one probability: 4 SE of the difference ≈ 0.063 at p = 0.5.
    for (let k = 1; k <= 4; k++) {
      expect(Math.abs(plan.forecasts[k - 1].probabilitySettled - settled[k] / runs)).toBeLessThan(4 * Math.sqrt(0.25 * (2 / runs)));
    }
  });

  test('a group that is already acceptable needs no more shifts to settle, and the statement says so', () => {
    const plan = samplePlanner(detected([0.01, 0.012, 0.009, 0.011, 0.0105, 0.0095]), { oel: 1, seed: 3, simulations: 200 });
    expect(plan.currentJudgement).toBe('acceptable');
    expect(plan.recommendedAdditional).toBe(0);
    expect(plan.statement).toMatch(/already settled \(acceptable\)/);
  });

  test('works with non-detects, simulating new results below the smallest limit as non-detects', () => {
    const data: ShiftValue[] = [...detected([0.3, 0.5, 0.25, 0.9, 0.4]), { value: 0.2, nonDetect: true }, { value: 0.2, nonDetect: true }];
    const plan = samplePlanner(data, { oel: 2, seed: 4, simulations: 300 });
    expect(plan.forecasts).toHaveLength(12);
    expect(plan.forecasts.every((f) => f.probabilitySettled >= 0 && f.probabilitySettled <= 1)).toBe(true);
  });

  test('the same seed gives the same plan', () => {
    expect(samplePlanner(UNCERTAIN, { oel: 1, seed: 11, simulations: 300 })).toEqual(samplePlanner(UNCERTAIN, { oel: 1, seed: 11, simulations: 300 }));
  });

  test('bad options and data are refused with the rule', () => {
    expect(() => samplePlanner(UNCERTAIN, { oel: -1 })).toThrow(/oel must be a finite number > 0/);
    expect(() => samplePlanner(UNCERTAIN, { oel: 1, maxAdditional: 0 })).toThrow(/maxAdditional must be an integer from 1 to 50/);
    expect(() => samplePlanner(UNCERTAIN, { oel: 1, targetProbability: 1 })).toThrow(/targetProbability/);
    expect(() => samplePlanner(detected([1, 2]), { oel: 1 })).toThrow(/at least 3 results/);
  });
});
