import { regularizedIncompleteBeta } from './incomplete-beta';
import { normalCdf } from './normal-distribution';
import type { ShiftValue } from './types';

/** One worker in the between-worker analysis. */
export interface WorkerSummary {
  worker: string;
  n: number;
  /** Mean of the worker's ln(values). */
  meanLog: number;
  /** exp(meanLog): the worker's geometric mean. */
  gm: number;
  /** True when the worker may not belong in the group (see flagRule). */
  flagged: boolean;
  /** Why the worker is flagged, in plain words; null when not flagged. */
  flagReason: string | null;
}

export interface BetweenWorkerAnalysis {
  method: string;
  /** Workers with ≥ 2 results (the analysis uses only these). */
  workers: number;
  /** Results used. */
  n: number;
  /** Results left out: workers with a single result and results without a worker code. */
  excludedResults: number;
  /** Non-detects replaced by limit/√2 before the analysis. */
  nonDetectsSubstituted: number;
  /** Searle's n0, the effective number of results per worker for an unbalanced design. */
  n0: number;
  sumOfSquaresBetween: number;
  sumOfSquaresWithin: number;
  degreesOfFreedomBetween: number;
  degreesOfFreedomWithin: number;
  meanSquareBetween: number;
  meanSquareWithin: number;
  /** F = MSB/MSW, the test of between-worker differences, and its p-value P(F(k−1, N−k) ≥ F). */
  fStatistic: number;
  pValue: number;
  /** Variance components of ln(value): σw² = MSW, σb² = max(0, (MSB − MSW)/n0). */
  withinVariance: number;
  betweenVariance: number;
  withinGsd: number;
  betweenGsd: number;
  /** σb² / (σb² + σw²). */
  intraclassCorrelation: number;
  /** Estimated μy, the mean of ln(value) over workers (weighted by 1/(σb² + σw²/n_i)). */
  meanLog: number;
  /** R0.95 = exp(3.92·σb), the ratio of the 97.5th to the 2.5th percentile of worker means. */
  ratio95: number;
  /** P(a random worker's long-term mean > OEL); null without an OEL. */
  probabilityWorkerMeanAboveOel: number | null;
  workerSummaries: WorkerSummary[];
  flagRule: string;
}

const METHOD =
  "One-way random-effects ANOVA on ln(values) with Searle's n0 for unbalanced groups (Searle, Casella & McCulloch 1992, " +
  "Variance Components, chapter 3); R0.95 (Rappaport 1991); probability that a worker's mean exceeds the OEL " +
  '(Lyles, Kupper & Rappaport 1997, from memory)';

const FLAG_RULE =
  'A worker is flagged when his or her mean log lies outside the 95 % range expected from the other workers ' +
  '(mean ± 1.96·√(σb² + σw²/n) with the components refitted without that worker) and also at least 2-fold from ' +
  "the others' geometric mean; needs at least 3 workers with 2 or more results.";

interface WorkerGroup {
  worker: string;
  logs: number[];
}

interface AnovaFit {
  k: number;
  total: number;
  n0: number;
  ssb: number;
  ssw: number;
  msb: number;
  msw: number;
  withinVariance: number;
  betweenVariance: number;
  meanLog: number;
  workerMeans: number[];
}

/** The one-way random-effects ANOVA of ln(values) by worker (balanced or not). */
function fitAnova(groups: readonly WorkerGroup[]): AnovaFit {
  const k = groups.length;
  const sizes = groups.map((g) => g.logs.length);
  const total = sizes.reduce((a, b) => a + b, 0);
  const workerMeans = groups.map((g) => g.logs.reduce((a, b) => a + b, 0) / g.logs.length);
  const grand = groups.reduce((a, g) => a + g.logs.reduce((b, y) => b + y, 0), 0) / total;
  let ssb = 0;
  let ssw = 0;
  groups.forEach((g, i) => {
    ssb += sizes[i] * (workerMeans[i] - grand) ** 2;
    for (const y of g.logs) ssw += (y - workerMeans[i]) ** 2;
  });
  const msb = ssb / (k - 1);
  const msw = ssw / (total - k);
  // Searle, Casella & McCulloch (1992), chapter 3: n0 = (N − Σ n_i²/N)/(k − 1); E(MSB) = σw² + n0·σb².
  const n0 = (total - sizes.reduce((a, s) => a + s * s, 0) / total) / (k - 1);
  const withinVariance = msw;
  const betweenVariance = Math.max(0, (msb - msw) / n0);
  // μy by generalized least squares with the ANOVA components: weights 1/(σb² + σw²/n_i); the plain
  // grand mean when σb² = 0, the mean of worker means in a balanced design.
  const weights = sizes.map((s) => 1 / (betweenVariance + withinVariance / s));
  const weightSum = weights.reduce((a, b) => a + b, 0);
  const meanLog = weights.reduce((a, w, i) => a + w * workerMeans[i], 0) / weightSum;
  return { k, total, n0, ssb, ssw, msb, msw, withinVariance, betweenVariance, meanLog, workerMeans };
}

/**
 * Between-worker analysis of an exposure group: one-way random-effects ANOVA of ln(value) by worker
 * (workers with ≥ 2 results), within- and between-worker variance components and GSDs, the intraclass
 * correlation, the F-test of between-worker differences, R0.95 = exp(3.92·σb) (Rappaport 1991,
 * "Assessment of long-term exposures to toxic substances in air", Annals of Occupational Hygiene
 * 35:61–121), and the probability that a randomly chosen worker's long-term mean exposure exceeds the
 * OEL, P = 1 − Φ[(ln OEL − μy − σw²/2)/σb] (Lyles, Kupper & Rappaport 1997, "Assessing regulatory
 * compliance of occupational exposures via the balanced one-way random effects ANOVA model", Journal of
 * Agricultural, Biological and Environmental Statistics 2:64–86 — *from memory*), where a worker's
 * long-term mean is exp(μy + b_i + σw²/2). When σb = 0 the probability is 1 or 0.
 *
 * Method of the variance components: Searle, Casella & McCulloch (1992), "Variance Components",
 * chapter 3, the 1-way classification (ANOVA estimators for unbalanced data with n0); F-test: MSB/MSW on (k − 1, N − k)
 * degrees of freedom. Non-detects are replaced by limit/√2 (Hornung & Reed 1990, "Estimation of average
 * concentration in the presence of nondetectable values", Applied Occupational and Environmental
 * Hygiene 5:46–51) and counted; results without a worker code, and workers with a single result, are
 * left out and counted. Also flags workers who may not belong (see FLAG_RULE).
 */
export function betweenWorkerAnalysis(values: readonly ShiftValue[], options: { oel?: number | null } = {}): BetweenWorkerAnalysis {
  const caller = 'betweenWorkerAnalysis';
  const oel = options.oel ?? null;
  if (oel !== null && (!(oel > 0) || !Number.isFinite(oel))) throw new RangeError(`${caller}: oel must be a finite number > 0, got ${oel}`);
  if (!Array.isArray(values)) throw new RangeError(`${caller}: values must be a list of shift results`);
  const byWorker = new Map<string, number[]>();
  let withoutWorker = 0;
  let nonDetectsSubstituted = 0;
  values.forEach((item, index) => {
    if (!item || typeof item.value !== 'number' || !Number.isFinite(item.value) || !(item.value > 0)) {
      throw new RangeError(`${caller}: result ${index + 1}: value must be a finite number > 0, got ${item?.value}`);
    }
    if (item.worker === undefined || item.worker === '') {
      withoutWorker++;
      return;
    }
    let value = item.value;
    if (item.nonDetect) {
      value = item.value / Math.SQRT2;
      nonDetectsSubstituted++;
    }
    const list = byWorker.get(item.worker) ?? [];
    list.push(Math.log(value));
    byWorker.set(item.worker, list);
  });
  const groups: WorkerGroup[] = [...byWorker.entries()]
    .filter(([, logs]) => logs.length >= 2)
    .map(([worker, logs]) => ({ worker, logs }))
    .sort((a, b) => (a.worker < b.worker ? -1 : a.worker > b.worker ? 1 : 0));
  const singles = [...byWorker.values()].filter((logs) => logs.length < 2).reduce((a, logs) => a + logs.length, 0);
  if (groups.length < 2) {
    throw new RangeError(
      `${caller}: needs at least 2 workers with 2 or more results each, got ${groups.length} (${byWorker.size} workers with a code, ${withoutWorker} results without one)`,
    );
  }
  const fit = fitAnova(groups);
  if (fit.total - fit.k < 1) throw new RangeError(`${caller}: needs more results than workers to estimate within-worker variation`);
  if (!(fit.msw > 0)) {
    throw new RangeError(`${caller}: every worker's results are identical, so within-worker variation cannot be estimated`);
  }
  const degreesOfFreedomBetween = fit.k - 1;
  const degreesOfFreedomWithin = fit.total - fit.k;
  const fStatistic = fit.msb / fit.msw;
  // P(F ≥ f) = I_x(ν2/2, ν1/2) with x = ν2/(ν2 + ν1·f) (Abramowitz & Stegun 1964, eq. 26.6.2).
  const x = degreesOfFreedomWithin / (degreesOfFreedomWithin + degreesOfFreedomBetween * fStatistic);
  const pValue = regularizedIncompleteBeta(x, degreesOfFreedomWithin / 2, degreesOfFreedomBetween / 2);
  const betweenSd = Math.sqrt(fit.betweenVariance);
  let probabilityWorkerMeanAboveOel: number | null = null;
  if (oel !== null) {
    const margin = Math.log(oel) - fit.meanLog - fit.withinVariance / 2;
    probabilityWorkerMeanAboveOel = betweenSd > 0 ? normalCdf(-margin / betweenSd) : margin < 0 ? 1 : 0;
  }
  return {
    method: METHOD,
    workers: fit.k,
    n: fit.total,
    excludedResults: withoutWorker + singles,
    nonDetectsSubstituted,
    n0: fit.n0,
    sumOfSquaresBetween: fit.ssb,
    sumOfSquaresWithin: fit.ssw,
    degreesOfFreedomBetween,
    degreesOfFreedomWithin,
    meanSquareBetween: fit.msb,
    meanSquareWithin: fit.msw,
    fStatistic,
    pValue,
    withinVariance: fit.withinVariance,
    betweenVariance: fit.betweenVariance,
    withinGsd: Math.exp(Math.sqrt(fit.withinVariance)),
    betweenGsd: Math.exp(betweenSd),
    intraclassCorrelation: fit.betweenVariance / (fit.betweenVariance + fit.withinVariance),
    meanLog: fit.meanLog,
    ratio95: Math.exp(3.92 * betweenSd),
    probabilityWorkerMeanAboveOel,
    workerSummaries: flagWorkers(groups, fit),
    flagRule: FLAG_RULE,
  };
}

/**
 * Flag workers who may not belong: leave-one-out, so an outlying worker cannot hide by inflating σb
 * (the 95 % range of worker means follows from the random-effects model, Rappaport 1991; the extra
 * 2-fold condition keeps trivial differences in tight groups from being flagged — common practice,
 * echoing the 2-fold range of worker means used by Kromhout, Symanski & Rappaport 1993).
 */
function flagWorkers(groups: readonly WorkerGroup[], fit: AnovaFit): WorkerSummary[] {
  return groups.map((group, index) => {
    const meanLog = fit.workerMeans[index];
    const summary: WorkerSummary = { worker: group.worker, n: group.logs.length, meanLog, gm: Math.exp(meanLog), flagged: false, flagReason: null };
    if (groups.length < 3) return summary;
    const others = groups.filter((_, j) => j !== index);
    const rest = fitAnova(others);
    if (!(rest.msw > 0)) return summary;
    const spread = 1.96 * Math.sqrt(rest.betweenVariance + rest.withinVariance / group.logs.length);
    const distance = meanLog - rest.meanLog;
    if (Math.abs(distance) > spread && Math.abs(distance) > Math.LN2) {
      const ratio = Math.exp(Math.abs(distance));
      summary.flagged = true;
      summary.flagReason = `geometric mean ${ratio.toFixed(1)}-fold ${distance > 0 ? 'above' : 'below'} the other workers', outside their 95 % range of worker means`;
    }
    return summary;
  });
}
