import { arithmeticMeanMvue, landConfidenceLimits } from './arithmetic-mean';
import { describeShiftValues, type DescriptiveStatistics } from './descriptive';
import { en689Assessment, en689Ut, type En689Outcome } from './en689';
import { exceedanceFraction, exceedanceFractionWithLimits } from './exceedance-fraction';
import { exposureCategory } from './exposure-category';
import { CLASSICAL_JUDGEMENT_RULES, classicalJudgement, judgementSentence } from './judgement';
import type { LogScaleSummary } from './log-scale-summary';
import { censoredLimits, fitWithNondetects, type LognormalFit } from './nondetects';
import { logProbabilityPlot, logProbabilityPlotFromPositions, type ProbabilityPlot } from './probability-plot';
import { shapiroWilk, type ShapiroWilkResult } from './shapiro-wilk';
import { percentile95, toleranceFactor } from './tolerance-limit';
import type { ExposureCategory, Judgement, ShiftValue } from './types';

/**
 * The classical assessment of one exposure group: checks the input against the refusal rules,
 * fits the lognormal model (directly, or through the non-detect methods of nondetects.ts), checks
 * the fit, and computes every figure of the classical view with the method cited in its own
 * module. Pure: the only randomness is the seeded bootstrap used for censored data.
 */

/** The refusal rules (issue 3, "Inputs and refusals") and two plausibility limits of our own. */
export const ASSESSMENT_RULES = Object.freeze({
  minResults: 3,
  minDetected: 3,
  maxNonDetectShare: 0.8,
  /** Values and the OEL must lie in [1e−15, 1e15]: beyond that a unit or typing error is certain. */
  smallestValue: 1e-15,
  largestValue: 1e15,
  /** A GSD above 100 cannot describe one exposure group (common practice calls GSD > 3 wide). */
  maxGsd: 100,
  /** Shapiro–Wilk (Royston 1995) is defined up to 5000 results. */
  maxShapiroWilkResults: 5000,
  /** The fit is called doubtful below this Shapiro–Wilk p on the logs (issue 3). */
  fitWarningP: 0.05,
});

/** Seed of the censored-data bootstrap when none is given. */
export const DEFAULT_ASSESSMENT_SEED = 20_240_601;

export interface AssessGroupInput {
  values: readonly ShiftValue[];
  oel: number;
  actionLevel?: number;
  seed?: number;
}

export interface FitCheck {
  /** Shapiro–Wilk on the natural logs (the lognormal check) and on the raw values (the normal check). */
  shapiroWilkLog: ShapiroWilkResult | null;
  shapiroWilkRaw: ShapiroWilkResult | null;
  /** Which results the test used, and why when not all. */
  basis: string;
  /** True when the lognormal fit is doubtful (p on the logs below 0.05). */
  doubtful: boolean;
  /** A plain warning when doubtful, else null. */
  warning: string | null;
  /** Likely reasons, those the data point to first; empty when the fit is not doubtful. */
  likelyReasons: string[];
}

export interface GroupAssessment {
  n: number;
  nonDetects: number;
  oel: number;
  actionLevel: number | null;
  descriptive: DescriptiveStatistics;
  /** The lognormal fit: μ and σ of the logs and the method that produced them. */
  fit: { mu: number; sigma: number; method: LognormalFit['method']; methodNote: string };
  /** GM and GSD of the fit. */
  gm: number;
  gsd: number;
  /** Arithmetic mean and SD: the sample figures for complete data, the fitted model's with non-detects. */
  am: number;
  sd: number;
  fitCheck: FitCheck;
  probabilityPlot: ProbabilityPlot;
  /** 95th percentile: point estimate and UTL95%,95%. */
  p95: number;
  utl95_95: number;
  /** Exceedance fraction of the OEL (0 … 1) with one-sided 95% limits and, for complete data, the two-sided 95% interval. */
  exceedanceFraction: number;
  exceedanceFractionLcl95: number;
  exceedanceFractionUcl95: number;
  exceedanceFractionInterval95: { lower: number; upper: number } | null;
  /** Arithmetic mean: MVUE (complete data) or the censored fit's estimate, with one-sided 95% limits. */
  amMvue: number;
  amLcl95: number;
  amUcl95: number;
  en689: En689Outcome;
  categoryByP95: ExposureCategory;
  categoryByUtl: ExposureCategory;
  judgement: Judgement;
  judgementRules: typeof CLASSICAL_JUDGEMENT_RULES;
  managerSentence: string;
  /** Each method used, with its source, in the order the figures appear. */
  methods: string[];
  /** Seed of the censored-data bootstrap (null for complete data, which needs none). */
  seed: number | null;
}

/**
 * Figures that depend on n alone (the tolerance factor K and EN 689's UT), remembered for the
 * length of one batch (assessMany) so that a file of many groups of one size computes them once.
 * Nothing is precomputed; a fresh cache starts empty.
 */
export interface AssessmentCache {
  toleranceFactor(n: number): number;
  en689Ut(n: number): number;
}

function memoize(compute: (n: number) => number): (n: number) => number {
  const known = new Map<number, number>();
  return (n) => {
    let value = known.get(n);
    if (value === undefined) {
      value = compute(n);
      known.set(n, value);
    }
    return value;
  };
}

/** A cache for one batch; see AssessmentCache. */
export function createAssessmentCache(): AssessmentCache {
  return { toleranceFactor: memoize((n) => toleranceFactor(n)), en689Ut: memoize(en689Ut) };
}

const NO_CACHE: AssessmentCache = { toleranceFactor: (n) => toleranceFactor(n), en689Ut };

function refuse(rule: string): never {
  throw new RangeError(`assessGroup: ${rule}`);
}

function checkPositiveFinite(name: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) refuse(`${name} must be a number greater than 0, got ${String(value)}`);
  if (value < ASSESSMENT_RULES.smallestValue || value > ASSESSMENT_RULES.largestValue) {
    refuse(`${name} ${value} is outside 1e-15 to 1e15; check the unit`);
  }
  return value;
}

/**
 * Throws a RangeError naming the rule for input the classical engine refuses: fewer than 3
 * results, a value ≤ 0 or not a number, all values equal, more than 80 % non-detects, fewer than
 * 3 detected values, a bad OEL, action level or seed.
 */
export function checkGroupInput(input: AssessGroupInput): void {
  if (input === null || typeof input !== 'object') refuse('input must be an object with values and oel');
  const { values, oel, actionLevel, seed } = input;
  if (!Array.isArray(values)) refuse('values must be a list of shift results');
  checkPositiveFinite('the OEL', oel);
  if (actionLevel !== undefined) checkPositiveFinite('the action level', actionLevel);
  if (seed !== undefined && (!Number.isInteger(seed) || seed < 1 || seed > 4294967295)) {
    refuse(`the seed must be an integer from 1 to 4294967295, got ${seed}`);
  }
  if (values.length < ASSESSMENT_RULES.minResults) {
    refuse(`at least ${ASSESSMENT_RULES.minResults} results are needed (rule: fewer than 3 results), got ${values.length}`);
  }
  values.forEach((v, i) => {
    if (v === null || typeof v !== 'object' || typeof v.nonDetect !== 'boolean') {
      refuse(`result ${i + 1} must have a value and a true/false non-detect flag`);
    }
    checkPositiveFinite(`result ${i + 1}${v.nonDetect ? ' (a non-detect: its detection limit)' : ''}`, v.value);
  });
  const nonDetects = values.filter((v) => v.nonDetect).length;
  if (nonDetects / values.length > ASSESSMENT_RULES.maxNonDetectShare) {
    refuse(`${nonDetects} of ${values.length} results are non-detects (rule: more than 80 % non-detects); too little is measured to fit a distribution`);
  }
  const detected = values.filter((v) => !v.nonDetect).map((v) => v.value);
  if (detected.length < ASSESSMENT_RULES.minDetected) {
    refuse(`at least ${ASSESSMENT_RULES.minDetected} detected values are needed (rule: fewer than 3 detected values), got ${detected.length}`);
  }
  if (detected.every((x) => x === detected[0])) {
    refuse(
      nonDetects === 0
        ? `all ${values.length} values are equal (${detected[0]}) (rule: all values equal); their spread cannot be estimated`
        : `all ${detected.length} detected values are equal (${detected[0]}) (rule: all values equal); their spread cannot be estimated`,
    );
  }
}

function formatP(p: number): string {
  return p < 0.001 ? '< 0.001' : p.toFixed(3);
}

/** Likely reasons for a doubtful fit, with the evidence the data give for each. */
function likelyReasons(logs: readonly number[], detectedValues: readonly number[]): string[] {
  const indicated: string[] = [];
  const n = logs.length;
  let mean = 0;
  for (const y of logs) mean += y;
  mean /= n;
  // An outlier: the fit becomes acceptable without the result farthest from the others.
  if (n >= 4 && n - 1 <= ASSESSMENT_RULES.maxShapiroWilkResults) {
    let far = 0;
    for (let i = 1; i < n; i++) if (Math.abs(logs[i] - mean) > Math.abs(logs[far] - mean)) far = i;
    const rest = logs.filter((_, i) => i !== far);
    if (rest.some((y) => y !== rest[0]) && shapiroWilk(rest).p >= ASSESSMENT_RULES.fitWarningP) {
      indicated.push(
        `An outlier: the result ${detectedValues[far]} stands apart from the others, and without it the lognormal fit is acceptable. ` +
          'Check it for a sampling or transcription error, or an unusual task on that shift.',
      );
    }
  }
  // Two processes: the sorted logs split at one wide gap into two clusters of at least 2 results.
  const sorted = [...logs].sort((a, b) => a - b);
  let gapAt = -1;
  let widest = 0;
  for (let i = 2; i <= n - 2; i++) {
    const gap = sorted[i] - sorted[i - 1];
    if (gap > widest) {
      widest = gap;
      gapAt = i;
    }
  }
  if (gapAt > 0) {
    const spread = (part: number[]) => {
      const m = part.reduce((a, b) => a + b, 0) / part.length;
      return Math.sqrt(part.reduce((a, b) => a + (b - m) ** 2, 0) / Math.max(1, part.length - 1));
    };
    const within = Math.max(spread(sorted.slice(0, gapAt)), spread(sorted.slice(gapAt)));
    if (widest > 2 * within && widest > 0.5) {
      indicated.push(
        `Two processes or tasks: the results form two clusters (${gapAt} up to ${Number(Math.exp(sorted[gapAt - 1]).toPrecision(3))}, ` +
          `${n - gapAt} from ${Number(Math.exp(sorted[gapAt]).toPrecision(3))}), as when a group spans two processes or tasks with different exposures.`,
      );
    }
  }
  const generic = [
    'A mixed group: workers whose tasks, processes or controls differ (compare results per worker in the between-worker analysis).',
    'An outlier: one result from a sampling or transcription error, or an unusual shift.',
    'Two processes or tasks with different exposure levels combined in one group.',
  ];
  const mentioned = (reason: string) => indicated.some((r) => r.split(':')[0] === reason.split(':')[0]);
  return [...indicated, ...generic.filter((reason) => !mentioned(reason))];
}

function fitCheckFor(values: readonly ShiftValue[]): FitCheck {
  const detected = values.filter((v) => !v.nonDetect).map((v) => v.value);
  const censored = detected.length < values.length;
  const basis = censored
    ? `The ${detected.length} detected values only: the test is not defined for non-detects, whose fit shows on the probability plot.`
    : `All ${values.length} results.`;
  if (detected.length > ASSESSMENT_RULES.maxShapiroWilkResults) {
    return {
      shapiroWilkLog: null,
      shapiroWilkRaw: null,
      basis: `Not tested: the Shapiro–Wilk test (Royston 1995) is defined for up to ${ASSESSMENT_RULES.maxShapiroWilkResults} results; use the probability plot.`,
      doubtful: false,
      warning: null,
      likelyReasons: [],
    };
  }
  const logs = detected.map(Math.log);
  const shapiroWilkLog = shapiroWilk(logs);
  const shapiroWilkRaw = shapiroWilk(detected);
  const doubtful = shapiroWilkLog.p < ASSESSMENT_RULES.fitWarningP;
  let warning: string | null = null;
  if (doubtful) {
    warning =
      `The results do not follow a lognormal distribution well (Shapiro–Wilk on the logs: W = ${shapiroWilkLog.w.toFixed(3)}, p ${shapiroWilkLog.p < 0.001 ? '' : '= '}${formatP(shapiroWilkLog.p)}). ` +
      'The figures below assume that they do, so treat them with caution and look at the probability plot.' +
      (shapiroWilkRaw.p >= ASSESSMENT_RULES.fitWarningP ? ` The raw values fit a normal distribution better (p = ${formatP(shapiroWilkRaw.p)}).` : '');
  }
  return {
    shapiroWilkLog,
    shapiroWilkRaw,
    basis,
    doubtful,
    warning,
    likelyReasons: doubtful ? likelyReasons(logs, detected) : [],
  };
}

const COMPLETE_METHODS = [
  'Lognormal fit: mean ȳ and SD s (n − 1) of the natural logs; GM = exp(ȳ), GSD = exp(s).',
  'Fit check: Shapiro–Wilk W and p, Royston (1995) AS R94; log-probability plot with Blom (1958) positions.',
  '95th percentile: exp(ȳ + 1.645·s); UTL95%,95% = exp(ȳ + K·s), K from the noncentral t (Owen 1968; NIST/SEMATECH e-Handbook 7.2.6.3).',
  'Exceedance fraction: 1 − Φ((ln OEL − ȳ)/s); exact limits by noncentral t inversion (Odeh & Owen 1980; Hewett & Ganser 1997).',
  "Arithmetic mean: Finney's (1941) minimum-variance unbiased estimate; Land's (1971, 1975) exact limits, computed.",
  'EN 689:2018: preliminary test (3–5 results) or statistical test with UT at 70 % confidence (Annex F).',
  'Exposure category on the 95th percentile: bands at 1, 10, 50 and 100 % of the OEL (Hewett et al. 2006).',
];

function ensureFinite(figures: Record<string, number>): void {
  for (const [name, value] of Object.entries(figures)) {
    if (!Number.isFinite(value)) refuse(`${name} is not a finite number (${value}); the data are too spread out for this figure`);
  }
}

/**
 * Assess one exposure group (classical view). Throws a RangeError naming the rule for refused
 * input (see checkGroupInput). With non-detects the fit and the limits come from nondetects.ts
 * (fitWithNondetects, censoredLimits with `seed`), and `fit.method` / `methods` say so.
 */
export function assessGroup(input: AssessGroupInput, cache: AssessmentCache = NO_CACHE): GroupAssessment {
  checkGroupInput(input);
  const { values, oel } = input;
  const actionLevel = input.actionLevel ?? null;
  const seed = input.seed ?? DEFAULT_ASSESSMENT_SEED;
  const n = values.length;
  const nonDetects = values.filter((v) => v.nonDetect).length;
  const descriptive = describeShiftValues(values, { oel, actionLevel: input.actionLevel });
  const fit = fitWithNondetects(values);
  if (!(fit.sigma > 0)) refuse('the fitted spread of the logs is zero; more distinct results are needed');
  if (fit.sigma > Math.log(ASSESSMENT_RULES.maxGsd)) {
    refuse(
      `the GSD is ${Number(Math.exp(fit.sigma).toPrecision(3))}, above ${ASSESSMENT_RULES.maxGsd} (rule: spread too wide for one exposure group); check units, typing errors and the grouping`,
    );
  }
  const summary: LogScaleSummary = { n, mean: fit.mu, sd: fit.sigma };
  const fitCheck = fitCheckFor(values);
  const gm = Math.exp(fit.mu);
  const gsd = Math.exp(fit.sigma);
  const p95 = percentile95(summary);
  const en689 = en689Assessment(values, summary, oel, cache.en689Ut);
  const methods: string[] = [];

  let am: number;
  let sd: number;
  let utl95_95: number;
  let efLower: number;
  let efUpper: number;
  let efInterval: { lower: number; upper: number } | null;
  let amEstimate: number;
  let amLcl95: number;
  let amUcl95: number;
  let probabilityPlot: ProbabilityPlot;
  if (nonDetects === 0) {
    am = descriptive.arithmeticMean as number;
    sd = descriptive.standardDeviation as number;
    // UTL95%,95% = exp(ȳ + K·s) (tolerance-limit.ts), with K from the batch cache when there is one.
    utl95_95 = Math.exp(summary.mean + cache.toleranceFactor(n) * summary.sd);
    const ef = exceedanceFractionWithLimits(summary, oel);
    efLower = ef.lcl95;
    efUpper = ef.ucl95;
    efInterval = ef.interval95;
    amEstimate = arithmeticMeanMvue(summary);
    const land = landConfidenceLimits(summary);
    amLcl95 = land.lower;
    amUcl95 = land.upper;
    probabilityPlot = logProbabilityPlot(
      values.map((v) => v.value),
      fit,
    );
    methods.push(...COMPLETE_METHODS);
  } else {
    const limits = censoredLimits(values, fit, oel, { seed });
    // The fitted model's mean and SD: exp(μ + σ²/2) and that times √(exp(σ²) − 1) (Aitchison & Brown 1957, §2.3).
    am = Math.exp(fit.mu + (fit.sigma * fit.sigma) / 2);
    sd = am * Math.sqrt(Math.expm1(fit.sigma * fit.sigma));
    utl95_95 = limits.utl95_95;
    efLower = limits.exceedanceFractionLower;
    efUpper = limits.exceedanceFractionUpper;
    efInterval = null;
    amEstimate = am;
    amLcl95 = limits.amLcl95;
    amUcl95 = limits.amUcl95;
    probabilityPlot = fit.plottingPositions
      ? logProbabilityPlotFromPositions(fit.plottingPositions, fit)
      : logProbabilityPlot(
          values.filter((v) => !v.nonDetect).map((v) => v.value),
          fit,
        );
    methods.push(
      `Lognormal fit with non-detects: ${fit.methodNote}`,
      'Fit check: Shapiro–Wilk W and p (Royston 1995) on the detected values; log-probability plot with the censored-data plotting positions.',
      '95th percentile: exp(μ̂ + 1.645·σ̂) from the censored-data fit; arithmetic mean exp(μ̂ + σ̂²/2).',
      `Confidence limits: ${limits.method}`,
      'EN 689:2018: preliminary test (3–5 results, a non-detect counted at its detection limit) or statistical test on the censored-data fit.',
      'Exposure category on the 95th percentile: bands at 1, 10, 50 and 100 % of the OEL (Hewett et al. 2006).',
    );
  }
  const estimate = exceedanceFraction(summary, oel);
  ensureFinite({ gm, gsd, am, sd, p95, utl95_95, amMvue: amEstimate, amLcl95, amUcl95, exceedanceFraction: estimate, efLower, efUpper });
  const judgement = classicalJudgement({ p95, utl95_95, oel });
  return {
    n,
    nonDetects,
    oel,
    actionLevel,
    descriptive,
    fit: { mu: fit.mu, sigma: fit.sigma, method: fit.method, methodNote: fit.methodNote },
    gm,
    gsd,
    am,
    sd,
    fitCheck,
    probabilityPlot,
    p95,
    utl95_95,
    exceedanceFraction: estimate,
    exceedanceFractionLcl95: efLower,
    exceedanceFractionUcl95: efUpper,
    exceedanceFractionInterval95: efInterval,
    amMvue: amEstimate,
    amLcl95,
    amUcl95,
    en689,
    categoryByP95: exposureCategory(p95, oel),
    categoryByUtl: exposureCategory(utl95_95, oel),
    judgement,
    judgementRules: CLASSICAL_JUDGEMENT_RULES,
    managerSentence: judgementSentence(judgement),
    methods,
    seed: nonDetects === 0 ? null : seed,
  };
}

/** One group for assessMany: a name and the assessGroup input. */
export interface NamedGroupInput extends AssessGroupInput {
  group: string;
}

export type NamedGroupResult = { group: string; assessment: GroupAssessment; error: null } | { group: string; assessment: null; error: string };

/**
 * Assess several groups; a group the rules refuse gets its error message and does not stop the
 * others. Only refusals (RangeError) are captured; anything else is a defect and is rethrown.
 */
export function assessMany(groups: readonly NamedGroupInput[]): NamedGroupResult[] {
  const cache = createAssessmentCache();
  return groups.map((input) => {
    try {
      return { group: input.group, assessment: assessGroup(input, cache), error: null };
    } catch (error) {
      if (error instanceof RangeError) return { group: input.group, assessment: null, error: error.message };
      throw error;
    }
  });
}
