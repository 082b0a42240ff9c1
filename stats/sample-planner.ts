import type { Judgement, ShiftValue } from './types';
import { createRandom } from './random';
import { Z_95 } from './normal-distribution';
import { toleranceFactor } from './tolerance-limit';
import { classicalJudgement } from './judgement';
import { fitWithNondetects, NONDETECT_RULES } from './nondetects';
import { robustRosLogs } from './ros';
import { censoredNormalMleEstimate } from './censored-mle';
import { DEFAULT_BAYES_SEED, sampleLognormalPosterior, type McmcSettings } from './bayes-gibbs';
import type { BayesPriorChoice } from './bayes-priors';

export interface SamplePlannerOptions {
  /** The OEL, in the unit of the values. */
  oel: number;
  /** Largest number of additional shifts to forecast. Default 12. */
  maxAdditional?: number;
  /** Simulated futures per forecast. Default 2,000 (Monte-Carlo SE of a probability ≤ 1.1 percentage points). */
  simulations?: number;
  /** Probability of a settled judgement that the recommended count must reach. Default 0.80. */
  targetProbability?: number;
  seed?: number;
  /** Prior of the posterior the futures are drawn from; default the reference prior. */
  prior?: BayesPriorChoice;
  /** MCMC settings of that posterior. */
  settings?: McmcSettings;
}

export interface SampleForecast {
  /** Number of additional shift results. */
  additional: number;
  /** P(the classical judgement of the data plus the new results is acceptable or unacceptable). */
  probabilitySettled: number;
  probabilityAcceptable: number;
  probabilityUnacceptable: number;
}

export interface SamplePlan {
  method: string;
  /** The classical judgement of the current data (by the planner's rule, see samplePlanner). */
  currentJudgement: Judgement;
  targetProbability: number;
  simulations: number;
  seed: number;
  forecasts: SampleForecast[];
  /** Smallest count reaching the target probability; 0 when already settled; null when more than maxAdditional would be needed. */
  recommendedAdditional: number | null;
  /** One sentence for the screen, always saying that it is a forecast, not a promise. */
  statement: string;
}

/** Default probability a recommended count must reach: 80 %, the usual power of a study plan (common practice). */
export const DEFAULT_PLANNER_TARGET = 0.8;

const METHOD =
  'Posterior predictive simulation (Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., section 6.3): (μ, σ) drawn from the ' +
  'Bayesian posterior of the current data, k new shift results simulated from the lognormal, and the classical judgement ' +
  '(UTL95%,95% ≤ OEL acceptable, P95 estimate > OEL unacceptable) applied to the data plus the k results';

/**
 * Sample planner: how likely k more shift results (k = 1 … maxAdditional) are to settle the group's
 * judgement, i.e. make it acceptable or unacceptable by the classical rule (classicalJudgement), and the
 * smallest k whose probability reaches the target (default 80 %).
 *
 * Method: posterior predictive simulation (Gelman et al. 2013, section 6.3). Each simulated future draws
 * (μ, σ) from the posterior of the current data (sampleLognormalPosterior, reference prior by default)
 * and twelve new results from lognormal(μ, σ); the forecast for k uses the first k of them (common random
 * numbers, so the forecasts for different k are comparable). The data plus the new results are then
 * judged: P95 = exp(μ̂ + z0.95·σ̂) and UTL95%,95% = exp(μ̂ + K(n)·σ̂) with the exact tolerance factor K
 * (toleranceFactor). For complete data μ̂, σ̂ are the mean and SD of the logs, exactly as in the classical
 * view. With non-detects, new results below the smallest reported detection limit are simulated as
 * non-detects at that limit, μ̂ and σ̂ come from fitWithNondetects (ROS or censored maximum likelihood), and
 * — a documented approximation, for speed — the UTL uses the complete-data factor K(n) instead of the
 * classical view's bootstrap limit, so forecasts for censored data lean optimistic. A simulated data set
 * the non-detect rules refuse counts as not settled. Seeded: same seed, same plan.
 */
export function samplePlanner(values: readonly ShiftValue[], options: SamplePlannerOptions): SamplePlan {
  const caller = 'samplePlanner';
  const { oel } = options;
  const maxAdditional = options.maxAdditional ?? 12;
  const simulations = options.simulations ?? 2_000;
  const target = options.targetProbability ?? DEFAULT_PLANNER_TARGET;
  const seed = options.seed ?? DEFAULT_BAYES_SEED;
  if (!(oel > 0) || !Number.isFinite(oel)) throw new RangeError(`${caller}: oel must be a finite number > 0, got ${oel}`);
  if (!Number.isInteger(maxAdditional) || maxAdditional < 1 || maxAdditional > 50) {
    throw new RangeError(`${caller}: maxAdditional must be an integer from 1 to 50, got ${maxAdditional}`);
  }
  if (!Number.isInteger(simulations) || simulations < 100) throw new RangeError(`${caller}: simulations must be an integer ≥ 100, got ${simulations}`);
  if (!(target > 0 && target < 1)) throw new RangeError(`${caller}: targetProbability must lie between 0 and 1, got ${target}`);
  const current = fitWithNondetects(values); // the classical refusals apply to the planner too
  const n = values.length;
  const draws = sampleLognormalPosterior(values, { prior: options.prior, settings: { seed, ...options.settings } });
  const random = createRandom(((seed + 0x5bd1e995) % 4_294_967_295) + 1);
  const factors = new Float64Array(maxAdditional + 1);
  for (let k = 0; k <= maxAdditional; k++) factors[k] = toleranceFactor(n + k);
  const judge = (mu: number, sigma: number, k: number): Judgement =>
    classicalJudgement({ p95: Math.exp(mu + Z_95 * sigma), utl95_95: Math.exp(mu + factors[k] * sigma), oel });
  const currentJudgement = judge(current.mu, current.sigma, 0);

  const censored = values.some((v) => v.nonDetect);
  const futureLimitLog = censored ? Math.log(Math.min(...values.filter((v) => v.nonDetect).map((v) => v.value))) : -Infinity;
  const baseDetectedLogs = values.filter((v) => !v.nonDetect).map((v) => Math.log(v.value));
  const baseLimitLogs = values.filter((v) => v.nonDetect).map((v) => Math.log(v.value));
  // Complete data: running sums of logs centred on the current mean, so ȳ and s stay exact for every k.
  const logs = values.filter((v) => !v.nonDetect).map((v) => Math.log(v.value));
  const centre = logs.reduce((a, b) => a + b, 0) / logs.length;
  const baseSum = logs.reduce((a, y) => a + (y - centre), 0);
  const baseSquares = logs.reduce((a, y) => a + (y - centre) * (y - centre), 0);
  const acceptable = new Int32Array(maxAdditional + 1);
  const unacceptable = new Int32Array(maxAdditional + 1);
  const future = new Float64Array(maxAdditional);
  const total = draws.mu.length;
  for (let s = 0; s < simulations; s++) {
    const j = random.integer(total);
    const mu = draws.mu[j];
    const sigma = draws.sigma[j];
    for (let i = 0; i < maxAdditional; i++) future[i] = mu + sigma * random.normal();
    if (!censored) {
      let sum = baseSum;
      let squares = baseSquares;
      for (let k = 1; k <= maxAdditional; k++) {
        const y = future[k - 1] - centre;
        sum += y;
        squares += y * y;
        const size = n + k;
        const mean = sum / size;
        const sd = Math.sqrt(Math.max(squares - sum * mean, 0) / (size - 1));
        const verdict = sd > 0 ? judge(mean + centre, sd, k) : 'uncertain';
        if (verdict === 'acceptable') acceptable[k]++;
        else if (verdict === 'unacceptable') unacceptable[k]++;
      }
      continue;
    }
    // Censored data: the same method choice as fitWithNondetects (ROS below 50 results, censored maximum
    // likelihood from 50), called on the logs directly to skip its plotting positions and notes.
    const detectedLogs = baseDetectedLogs.slice();
    const limitLogs = baseLimitLogs.slice();
    for (let k = 1; k <= maxAdditional; k++) {
      const y = future[k - 1];
      if (y < futureLimitLog) limitLogs.push(futureLimitLog);
      else detectedLogs.push(y);
      const size = n + k;
      let verdict: Judgement = 'uncertain';
      if (limitLogs.length <= NONDETECT_RULES.maxNonDetectShare * size && detectedLogs.length >= NONDETECT_RULES.minDetected) {
        try {
          const fit =
            size >= NONDETECT_RULES.maximumLikelihoodFromResults
              ? censoredNormalMleEstimate(detectedLogs, limitLogs, { start: current })
              : robustRosLogs(detectedLogs, limitLogs);
          if (fit.sigma > 0 && Number.isFinite(fit.mu)) verdict = judge(fit.mu, fit.sigma, k);
        } catch (error) {
          if (!(error instanceof RangeError)) throw error;
        }
      }
      if (verdict === 'acceptable') acceptable[k]++;
      else if (verdict === 'unacceptable') unacceptable[k]++;
    }
  }
  const forecasts: SampleForecast[] = [];
  for (let k = 1; k <= maxAdditional; k++) {
    forecasts.push({
      additional: k,
      probabilitySettled: (acceptable[k] + unacceptable[k]) / simulations,
      probabilityAcceptable: acceptable[k] / simulations,
      probabilityUnacceptable: unacceptable[k] / simulations,
    });
  }
  const settledNow = currentJudgement !== 'uncertain';
  const reaching = forecasts.find((f) => f.probabilitySettled >= target);
  const recommendedAdditional = settledNow ? 0 : reaching ? reaching.additional : null;
  return {
    method: METHOD,
    currentJudgement,
    targetProbability: target,
    simulations,
    seed,
    forecasts,
    recommendedAdditional,
    statement: plannerStatement(currentJudgement, forecasts, recommendedAdditional, maxAdditional),
  };
}

const percent = (p: number): string => `${Math.round(p * 100)} %`;
/** "a" or "an" before a spoken percentage: an 8 %, an 11 %, an 18 %, an 80–89 %. */
const withArticle = (p: number): string => {
  const value = Math.round(p * 100);
  const vowelSound = value === 8 || value === 11 || value === 18 || (value >= 80 && value <= 89);
  return `${vowelSound ? 'an' : 'a'} ${percent(p)}`;
};

function plannerStatement(current: Judgement, forecasts: readonly SampleForecast[], recommended: number | null, maxAdditional: number): string {
  const promise = 'this is a forecast from the current data, not a promise.';
  if (current !== 'uncertain') {
    return `The group's judgement is already settled (${current}) on the current data; more shifts are not needed to settle it, though the sampling plan or review date may call for them.`;
  }
  if (recommended !== null) {
    const f = forecasts[recommended - 1];
    const shifts = recommended === 1 ? '1 more shift' : `${recommended} more shifts`;
    return `With ${shifts} there is ${withArticle(f.probabilitySettled)} chance that the group's judgement will be settled (acceptable or unacceptable); ${promise}`;
  }
  const last = forecasts[forecasts.length - 1];
  return `Even with ${maxAdditional} more shifts there is only a ${percent(last.probabilitySettled)} chance that the group's judgement will be settled (acceptable or unacceptable), so more than ${maxAdditional} would likely be needed; ${promise}`;
}
