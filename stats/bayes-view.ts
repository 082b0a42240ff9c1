import type { Judgement, ShiftValue } from './types';
import { Z_95 } from './normal-distribution';
import { sampleLognormalPosterior, type McmcSettings, type PosteriorDraws } from './bayes-gibbs';
import type { BayesPriorChoice, BayesPriorRecord, PosteriorMoments } from './bayes-priors';
import { convergenceWarnings, effectiveSampleSize, splitRHat } from './bayes-diagnostics';
import {
  BAYES_ACCEPTABLE_THRESHOLD,
  DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD,
  bayesianJudgement,
  categoryProbabilities,
  exceedanceFromStandardized,
  summarizeMonotone,
  type PosteriorSummary,
} from './bayes-summary';

export interface BayesianViewOptions {
  /** The OEL in the unit of the values; without it the OEL-based figures are null. */
  oel?: number | null;
  /** Prior; default the reference prior. */
  prior?: BayesPriorChoice;
  /** Chains, burn-in, kept draws, seed. */
  settings?: McmcSettings;
  /** Organization setting: P(P95 > OEL) at or above which the group is unacceptable. Default 0.30. */
  unacceptableThreshold?: number;
}

export interface BayesianDiagnostics {
  chains: number;
  burnIn: number;
  kept: number;
  seed: number;
  rHat: { mu: number; sigma: number };
  effectiveSampleSize: { mu: number; sigma: number };
  /** Metropolis acceptance of σ (informative GSD prior only). */
  sigmaAcceptanceRate: number | null;
  /** Plain-language warnings when R-hat > 1.01 or ESS < 1,000; empty when the diagnostics are good. */
  warnings: string[];
}

/** The Bayesian view of one exposure group. */
export interface BayesianView {
  method: string;
  prior: BayesPriorRecord;
  n: number;
  nDetected: number;
  nLeftCensored: number;
  nIntervalCensored: number;
  oel: number | null;
  gm: PosteriorSummary;
  gsd: PosteriorSummary;
  p95: PosteriorSummary;
  arithmeticMean: PosteriorSummary;
  /** Exceedance fraction as a share (0–1) of shifts above the OEL; null without an OEL. */
  exceedanceFraction: PosteriorSummary | null;
  /** Posterior probabilities of exposure categories 0–4 (P95 in each band of the OEL); null without an OEL. */
  categoryProbabilities: [number, number, number, number, number] | null;
  /** P(P95 > OEL), the same as categoryProbabilities[4]; null without an OEL. */
  probabilityP95AboveOel: number | null;
  judgement: Judgement | null;
  unacceptableThreshold: number;
  judgementRule: string;
  /** Moments of μ and ln σ, to serve as prior (c) of a later assessment. */
  moments: PosteriorMoments;
  diagnostics: BayesianDiagnostics;
}

const METHOD =
  'Lognormal model on ln(values); posterior of (μ, σ) by Gibbs sampling with data augmentation for censored results ' +
  '(Tanner & Wong 1987; Gelman et al. 2013, Bayesian Data Analysis, 3rd ed., sections 3.3 and 11); split R-hat and ' +
  'effective sample size (Gelman et al. 2013 section 11.4–11.5; Vehtari et al. 2021)';

/**
 * The Bayesian view of an exposure group: posterior of the lognormal μ and σ from detected, left- and
 * interval-censored results (sampleLognormalPosterior), its summaries — GM, GSD, 95th percentile
 * exp(μ + z0.95·σ), arithmetic mean exp(μ + σ²/2) (Aitchison & Brown 1957, "The Lognormal
 * Distribution", section 2.3), exceedance fraction 1 − Φ((ln OEL − μ)/σ) — the exposure category
 * probabilities, P(P95 > OEL), the judgement (bayesianJudgement), and diagnostics with warnings.
 */
export function bayesianView(values: readonly ShiftValue[], options: BayesianViewOptions = {}): BayesianView {
  const oel = options.oel ?? null;
  if (oel !== null && (!(oel > 0) || !Number.isFinite(oel))) {
    throw new RangeError(`bayesianView: oel must be a finite number > 0, got ${oel}`);
  }
  const threshold = options.unacceptableThreshold ?? DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD;
  // Checked before sampling so bad settings fail fast.
  bayesianJudgement(0, threshold);
  const draws = sampleLognormalPosterior(values, { prior: options.prior, settings: options.settings });
  return summarizePosterior(draws, oel, threshold);
}

/** Summaries, category probabilities, judgement and diagnostics of posterior draws (see bayesianView). */
export function summarizePosterior(draws: PosteriorDraws, oel: number | null, unacceptableThreshold = DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD): BayesianView {
  const { mu, sigma, chains } = draws;
  const total = mu.length;
  const scratch = new Float64Array(total);
  const derived = new Float64Array(total);

  const gm = summarizeMonotone(mu, Math.exp, false, scratch);
  const gsd = summarizeMonotone(sigma, Math.exp, false, scratch);
  for (let i = 0; i < total; i++) derived[i] = mu[i] + Z_95 * sigma[i];
  // Derived draws are summarized in place (their order no longer matters).
  let categories: BayesianView['categoryProbabilities'] = null;
  if (oel !== null) categories = categoryProbabilities(derived, oel);
  const p95 = summarizeMonotone(derived, Math.exp, false, derived);
  for (let i = 0; i < total; i++) derived[i] = mu[i] + 0.5 * sigma[i] * sigma[i];
  const arithmeticMean = summarizeMonotone(derived, Math.exp, false, derived);
  let exceedanceFraction: PosteriorSummary | null = null;
  if (oel !== null) {
    const logOel = Math.log(oel);
    for (let i = 0; i < total; i++) derived[i] = (logOel - mu[i]) / sigma[i];
    exceedanceFraction = summarizeMonotone(derived, exceedanceFromStandardized, true, derived);
  }

  let muSum = 0;
  let logSigmaSum = 0;
  for (let i = 0; i < total; i++) {
    derived[i] = Math.log(sigma[i]);
    muSum += mu[i];
    logSigmaSum += derived[i];
  }
  const muMean = muSum / total;
  const logSigmaMean = logSigmaSum / total;
  let muSquares = 0;
  let logSigmaSquares = 0;
  for (let i = 0; i < total; i++) {
    muSquares += (mu[i] - muMean) ** 2;
    logSigmaSquares += (derived[i] - logSigmaMean) ** 2;
  }

  const rHat = { mu: splitRHat(mu, chains), sigma: splitRHat(sigma, chains) };
  const ess = { mu: effectiveSampleSize(mu, chains), sigma: effectiveSampleSize(sigma, chains) };
  const probabilityAbove = categories ? categories[4] : null;
  return {
    method: METHOD,
    prior: draws.prior.record,
    n: draws.n,
    nDetected: draws.nDetected,
    nLeftCensored: draws.nLeftCensored,
    nIntervalCensored: draws.nIntervalCensored,
    oel,
    gm,
    gsd,
    p95,
    arithmeticMean,
    exceedanceFraction,
    categoryProbabilities: categories,
    probabilityP95AboveOel: probabilityAbove,
    judgement: probabilityAbove === null ? null : bayesianJudgement(probabilityAbove, unacceptableThreshold),
    unacceptableThreshold,
    judgementRule: `unacceptable when P(P95 > OEL) ≥ ${unacceptableThreshold}; acceptable when P(P95 > OEL) ≤ ${BAYES_ACCEPTABLE_THRESHOLD}; otherwise uncertain`,
    moments: {
      muMean,
      muSd: Math.sqrt(muSquares / (total - 1)),
      logSigmaMean,
      logSigmaSd: Math.sqrt(logSigmaSquares / (total - 1)),
    },
    diagnostics: {
      chains,
      burnIn: draws.burnIn,
      kept: draws.kept,
      seed: draws.seed,
      rHat,
      effectiveSampleSize: ess,
      sigmaAcceptanceRate: draws.sigmaAcceptanceRate,
      warnings: convergenceWarnings(rHat, ess),
    },
  };
}

/** The `bayes` field of `npm run -s assess` (PRODUCT.md, "Command-line contracts"). */
export interface AssessBayesOutput {
  gm: PosteriorSummary;
  gsd: PosteriorSummary;
  p95: PosteriorSummary;
  exceedanceFraction: PosteriorSummary | null;
  categoryProbabilities: [number, number, number, number, number] | null;
}

/** Map a Bayesian view to exactly the `bayes` shape of the assess command. */
export function toAssessBayesOutput(view: BayesianView): AssessBayesOutput {
  return {
    gm: view.gm,
    gsd: view.gsd,
    p95: view.p95,
    exceedanceFraction: view.exceedanceFraction,
    categoryProbabilities: view.categoryProbabilities,
  };
}
