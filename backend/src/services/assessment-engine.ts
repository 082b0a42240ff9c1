/**
 * The one path from shift values to figures, shared by `npm run -s assess` (backend/src/cli/assess.ts)
 * and the assessment API (services/assessment.ts), so the browser and the command line can never
 * disagree (issue 7: "no second implementation"):
 * - the contract report of PRODUCT.md ("Command-line contracts"): `reportOf`, `errorReportOf`;
 * - the Bayesian figures of `assess --bayes`: `bayesFigures`;
 * - the tasks the worker threads run (services/assessment-worker.ts): `runEngineTask`.
 * Everything here is a pure function of its input (seeded), so a task gives the same answer in any thread.
 */
import { assessGroup, type GroupAssessment } from '@stats/assess-group';
import { bayesianView, toAssessBayesOutput, type BayesianView } from '@stats/bayes-view';
import type { BayesPriorChoice } from '@stats/bayes-priors';
import { betweenWorkerAnalysis, type BetweenWorkerAnalysis } from '@stats/between-worker';
import { describeShiftValues, type DescriptiveStatistics } from '@stats/descriptive';
import { DEFAULT_PLANNER_TARGET, samplePlanner, type SamplePlan } from '@stats/sample-planner';
import type { ShiftValue } from '@stats/types';
import type { AssessBayesFigures, AssessGroupReport, PriorName } from '@schema/assessment';

// The contract's types live in schema/ so that the browser can read them too.
export type { AssessBayesFigures, AssessGroupReport, BayesInterval, PriorName } from '@schema/assessment';

/** The engine names itself in its refusals ("assessGroup: …"); reports and API errors give the rule alone. */
export function refusalRule(message: string): string {
  return message.replace(/^assessGroup: /, '');
}

/** A refusal of another engine function without the function's name ("betweenWorkerAnalysis: needs …" → "needs …"). */
function withoutFunctionName(message: string): string {
  return message.replace(/^[A-Za-z]+: /, '');
}

/** The report of a group that cannot be assessed: the error and null figures. */
export function errorReportOf(group: string, error: string): AssessGroupReport {
  return {
    group,
    n: null,
    nCensored: null,
    error,
    gm: null,
    gsd: null,
    am: null,
    sd: null,
    p95: null,
    utl95_95: null,
    exceedanceFraction: null,
    exceedanceFractionUcl95: null,
    amMvue: null,
    amUcl95: null,
    shapiroWilk: null,
    en689: null,
    categoryByP95: null,
    categoryByUtl: null,
    judgement: null,
    method: null,
    bayes: null,
  };
}

/** The contract report of an assessed group (PRODUCT.md "Command-line contracts"). */
export function reportOf(group: string, assessment: GroupAssessment, bayes: AssessBayesFigures | null): AssessGroupReport {
  return {
    group,
    n: assessment.n,
    nCensored: assessment.nonDetects,
    error: null,
    gm: assessment.gm,
    gsd: assessment.gsd,
    am: assessment.am,
    sd: assessment.sd,
    p95: assessment.p95,
    utl95_95: assessment.utl95_95,
    exceedanceFraction: assessment.exceedanceFraction,
    exceedanceFractionUcl95: assessment.exceedanceFractionUcl95,
    amMvue: assessment.amMvue,
    amUcl95: assessment.amUcl95,
    shapiroWilk: assessment.fitCheck.shapiroWilkLog,
    en689: { ur: assessment.en689.ur, ut: assessment.en689.ut, result: assessment.en689.result },
    categoryByP95: assessment.categoryByP95,
    categoryByUtl: assessment.categoryByUtl,
    judgement: assessment.judgement,
    method: assessment.fit.method,
    bayes,
  };
}

/** The `bayes` figures of a Bayesian view, or null when the view has no OEL-based figures. */
export function bayesFiguresOf(view: BayesianView): AssessBayesFigures | null {
  const figures = toAssessBayesOutput(view);
  if (figures.exceedanceFraction === null || figures.categoryProbabilities === null) return null;
  return { ...figures, exceedanceFraction: figures.exceedanceFraction, categoryProbabilities: figures.categoryProbabilities };
}

/** The engine's prior for a name (API `?prior=`; the command line always uses `reference`): the reference prior, or the informative GSD prior with its published defaults. */
export function priorChoice(name: PriorName): BayesPriorChoice {
  return name === 'gsd-informative' ? { kind: 'informative-gsd' } : { kind: 'reference' };
}

/** One group's Bayesian run: `assess --bayes` passes values, OEL and seed; the API also a prior and a threshold. */
export interface BayesJob {
  values: readonly ShiftValue[];
  oel: number;
  seed: number;
  prior?: PriorName;
  /** Organization setting: P(P95 > OEL) at or above which the view judges the group unacceptable. */
  unacceptableThreshold?: number;
}

/** The full Bayesian view of a job, or the rule that refuses it. */
export function bayesViewOf(job: BayesJob): { view: BayesianView; refusal: null } | { view: null; refusal: string } {
  try {
    const view = bayesianView(job.values, {
      oel: job.oel,
      prior: priorChoice(job.prior ?? 'reference'),
      settings: { seed: job.seed },
      unacceptableThreshold: job.unacceptableThreshold,
    });
    return { view, refusal: null };
  } catch (error) {
    if (error instanceof RangeError) return { view: null, refusal: withoutFunctionName(error.message) };
    throw error;
  }
}

/** The figures of `assess --bayes` for one group (reference prior); null when the Bayesian view refuses the data. */
export function bayesFigures(job: BayesJob): AssessBayesFigures | null {
  const { view } = bayesViewOf({ values: job.values, oel: job.oel, seed: job.seed });
  return view ? bayesFiguresOf(view) : null;
}

/** Input of the classical task: one group's values (with worker codes for the between-worker analysis). */
export interface ClassicalJob {
  values: readonly ShiftValue[];
  oel: number;
  actionLevel?: number;
  seed: number;
}

/** The classical assessment and the between-worker analysis, or the rule that refuses the group. */
export type ClassicalOutcome =
  | {
      assessment: GroupAssessment;
      refusal: null;
      betweenWorker: BetweenWorkerAnalysis | null;
      /** Why there is no between-worker analysis (e.g. fewer than 2 workers with 2 results); null when there is one. */
      betweenWorkerReason: string | null;
    }
  | {
      assessment: null;
      /** The rule broken, in the engine's words without its name. */
      refusal: string;
      /** Descriptive statistics when they can still be given (at least one detected value), else null. */
      descriptive: DescriptiveStatistics | null;
    };

/** The classical view (assessGroup, as the command line) and the between-worker analysis of one group. */
export function classicalOutcome(job: ClassicalJob): ClassicalOutcome {
  const input = { values: job.values, oel: job.oel, seed: job.seed, ...(job.actionLevel === undefined ? {} : { actionLevel: job.actionLevel }) };
  let assessment: GroupAssessment;
  try {
    assessment = assessGroup(input);
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    let descriptive: DescriptiveStatistics | null = null;
    try {
      descriptive = describeShiftValues(job.values, { oel: job.oel, actionLevel: job.actionLevel });
    } catch (describeError) {
      if (!(describeError instanceof RangeError)) throw describeError;
    }
    return { assessment: null, refusal: refusalRule(error.message), descriptive };
  }
  try {
    return { assessment, refusal: null, betweenWorker: betweenWorkerAnalysis(job.values, { oel: job.oel }), betweenWorkerReason: null };
  } catch (error) {
    if (!(error instanceof RangeError)) throw error;
    return { assessment, refusal: null, betweenWorker: null, betweenWorkerReason: withoutFunctionName(error.message) };
  }
}

/** What the planner is asked: k = 1..12 more shifts, 2,000 simulated futures each, 80 % to recommend a count (issue 4). */
export const PLANNER_SETTINGS = Object.freeze({ maxAdditional: 12, simulations: 2_000, targetProbability: DEFAULT_PLANNER_TARGET });

/** The sample planner for a job (PLANNER_SETTINGS, the job's prior and seed), or the rule that refuses it. */
export function plannerOf(job: BayesJob): { plan: SamplePlan; refusal: null } | { plan: null; refusal: string } {
  try {
    return {
      plan: samplePlanner(job.values, { oel: job.oel, seed: job.seed, prior: priorChoice(job.prior ?? 'reference'), ...PLANNER_SETTINGS }),
      refusal: null,
    };
  } catch (error) {
    if (error instanceof RangeError) return { plan: null, refusal: withoutFunctionName(error.message) };
    throw error;
  }
}

/** Work a worker thread can be given. */
export type EngineTask =
  | { kind: 'bayes-figures'; job: BayesJob }
  | { kind: 'classical'; job: ClassicalJob }
  | { kind: 'bayes-view'; job: BayesJob }
  | { kind: 'planner'; job: BayesJob };

/** What each kind of task answers. */
export interface EngineResults {
  'bayes-figures': AssessBayesFigures | null;
  classical: ClassicalOutcome;
  'bayes-view': ReturnType<typeof bayesViewOf>;
  planner: ReturnType<typeof plannerOf>;
}
export type EngineTaskOf<K extends EngineTask['kind']> = Extract<EngineTask, { kind: K }>;

/** Run one task in this thread. Refusals come back as values; anything thrown is a defect. */
export function runEngineTask<K extends EngineTask['kind']>(task: EngineTaskOf<K>): EngineResults[K] {
  const run = task as EngineTask;
  switch (run.kind) {
    case 'bayes-figures':
      return bayesFigures(run.job) as EngineResults[K];
    case 'classical':
      return classicalOutcome(run.job) as EngineResults[K];
    case 'bayes-view':
      return bayesViewOf(run.job) as EngineResults[K];
    case 'planner':
      return plannerOf(run.job) as EngineResults[K];
  }
}
