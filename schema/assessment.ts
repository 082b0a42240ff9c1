import { z } from 'zod';
import type { GroupAssessment } from '@stats/assess-group';
import type { BayesianView } from '@stats/bayes-view';
import type { BetweenWorkerAnalysis } from '@stats/between-worker';
import type { DescriptiveStatistics } from '@stats/descriptive';
import type { SamplePlan } from '@stats/sample-planner';
import type { ExposureCategory, Judgement } from '@stats/types';
import type { AgentKind, AveragingTime, ExposureUnit } from './agents';
import type { NoiseCriteriaSet } from './exposure-groups';
import type { ResultSource } from './shift-results';

/*
 * The group assessment over the wire: GET /api/orgs/:orgId/exposure-groups/:groupId/assessment
 * (backend/src/routes/assessment.ts) and the contract report of `npm run -s assess`
 * (PRODUCT.md "Command-line contracts"), which the API includes so both can be compared field by field.
 */

/** Priors the page may choose (docs/decisions/003-bayesian-view.md): reference (default) or the informative GSD prior. */
export const priorNames = ['reference', 'gsd-informative'] as const;
export type PriorName = (typeof priorNames)[number];

/** `?exclude=3,17` — result ids left out of this run (what-if); stored data never changes. */
const excludeList = z
  .string()
  .trim()
  .max(4000, 'Leave out at most a few hundred results')
  .refine((text) => text === '' || /^\d+(\s*,\s*\d+)*$/.test(text), 'Use result ids separated by commas, e.g. 3,17')
  .transform((text) => (text === '' ? [] : [...new Set(text.split(',').map((id) => Number(id.trim())))].sort((a, b) => a - b)));

export const assessmentQuery = z.object({
  exclude: excludeList.optional().transform((ids) => ids ?? []),
  prior: z.enum(priorNames, { message: `Use one of ${priorNames.join(', ')}` }).default('reference'),
});
export type AssessmentQuery = z.infer<typeof assessmentQuery>;

export interface BayesInterval {
  median: number;
  lower: number;
  upper: number;
  q95: number;
}

/** The Bayesian figures of one group as the assess command prints them (PRODUCT.md). */
export interface AssessBayesFigures {
  gm: BayesInterval;
  gsd: BayesInterval;
  p95: BayesInterval;
  exceedanceFraction: BayesInterval;
  categoryProbabilities: [number, number, number, number, number];
}

/** One group of the assess command's document; every figure is null when `error` is set. */
export interface AssessGroupReport {
  group: string;
  n: number | null;
  nCensored: number | null;
  error: string | null;
  gm: number | null;
  gsd: number | null;
  am: number | null;
  sd: number | null;
  p95: number | null;
  utl95_95: number | null;
  exceedanceFraction: number | null;
  exceedanceFractionUcl95: number | null;
  amMvue: number | null;
  amUcl95: number | null;
  shapiroWilk: { w: number; p: number } | null;
  en689: { ur: number | null; ut: number | null; result: 'compliant' | 'non-compliant' | 'no-decision' } | null;
  categoryByP95: ExposureCategory | null;
  categoryByUtl: ExposureCategory | null;
  /** Not in the PRODUCT.md list; added so that the record says how the figures were made. */
  judgement: Judgement | null;
  method: 'complete' | 'censored-mle' | 'ros' | null;
  bayes: AssessBayesFigures | null;
}

/** One shift result as the assessment uses it (or left out of it). */
export interface AssessmentResult {
  id: number;
  workerCode: string;
  date: string;
  /** In the group's OEL unit; for a non-detect, its detection limit. */
  value: number;
  nonDetect: boolean;
  source: ResultSource;
}

export interface AssessmentGroup {
  id: number;
  name: string;
  siteName: string;
  agent: { id: number; name: string; kind: AgentKind };
  /** The limit judged against: the group's OEL after any extended-shift adjustment. */
  oel: number;
  /** The OEL as set on the group, before adjustment. */
  baseOel: number;
  oelUnit: ExposureUnit;
  oelSource: string;
  oelAveragingTime: AveragingTime;
  /** How the judged limit was reached, in words. */
  oelStatement: string;
  actionLevel: number | null;
  noiseCriteriaSet: NoiseCriteriaSet | null;
  /** Goes up with every change to the group's results (decision records compare it). */
  dataVersion: number;
}

export interface AssessmentData {
  /** The valid results used, in order of date, worker code and id (the order the engine received). */
  results: AssessmentResult[];
  /** Valid results left out by `?exclude=` (what-if). */
  excluded: AssessmentResult[];
  excludedIds: number[];
  /** SHA-256 (hex) of the canonical JSON of the values used, the OEL and the settings. */
  dataHash: string;
}

export interface AssessmentSettings {
  /** Seed of the censored-data bootstrap, the Markov chains and the planner (the command line's default). */
  seed: number;
  prior: PriorName;
  /** P(P95 > OEL) at or above which the Bayesian view judges the group unacceptable. */
  unacceptableThreshold: number;
  unacceptableThresholdSource: 'organization' | 'default';
  mcmc: { chains: number; burnIn: number; kept: number };
  planner: { maxAdditional: number; simulations: number; targetProbability: number };
}

/** The hearing conservation trigger shown wherever noise results are shown (PRODUCT.md "Cautions"). */
export interface HearingConservationNote {
  actionLevel: number | null;
  unit: ExposureUnit;
  statement: string;
  /** Results used at or above the action level (detected values only); null without an action level. */
  resultsAtOrAboveActionLevel: number | null;
}

export interface EngineVersion {
  /** package.json version of Bellwether. */
  application: string;
  /** stats/engine-version.ts. */
  statistics: string;
}

/** What every answer carries, assessed or not. */
interface AssessmentContext {
  group: AssessmentGroup;
  data: AssessmentData;
  settings: AssessmentSettings;
  engineVersion: EngineVersion;
  cautions: string[];
  hearingConservation: HearingConservationNote | null;
}

/** 200: the group's full assessment. */
export interface GroupAssessmentResponse extends AssessmentContext {
  classical: GroupAssessment;
  /** The same figures in the command line's contract shape (services/assessment-engine.ts reportOf). */
  report: AssessGroupReport;
  bayes: BayesianView | null;
  betweenWorker: BetweenWorkerAnalysis | null;
  planner: SamplePlan | null;
  /** Why a part is missing (the rule in the engine's words); null when it is there. */
  unavailable: { bayes: string | null; betweenWorker: string | null; planner: string | null };
  /** How long the figures took when first computed, and whether this answer came from the cache. */
  computation: { milliseconds: number; cached: boolean };
}

/** 422 `error.details`: the group cannot be assessed; the rule and what can still be said. */
export interface AssessmentRefusalDetails extends AssessmentContext {
  rule: string;
  /** Descriptive statistics when at least one detected value is left, else null. */
  descriptive: DescriptiveStatistics | null;
}
