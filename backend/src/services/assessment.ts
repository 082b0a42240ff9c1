import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { and, asc, eq } from 'drizzle-orm';
import { exposureUnitLabels } from '@schema/agents';
import type {
  AssessmentData,
  AssessmentGroup,
  AssessmentRefusalDetails,
  AssessmentResult,
  AssessmentSettings,
  EngineVersion,
  GroupAssessmentResponse,
  HearingConservationNote,
  PriorName,
} from '@schema/assessment';
import { organizations, organizationSettings } from '@schema/organizations';
import { shiftResults } from '@schema/shift-results';
import { workers } from '@schema/workers';
import { DEFAULT_ASSESSMENT_SEED } from '@stats/assess-group';
import { DEFAULT_MCMC_SETTINGS } from '@stats/bayes-gibbs';
import { DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD } from '@stats/bayes-summary';
import { STATS_ENGINE_VERSION } from '@stats/engine-version';
import type { ShiftValue } from '@stats/types';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { Unprocessable } from '../errors';
import { PLANNER_SETTINGS, reportOf, bayesFiguresOf, type BayesJob, type ClassicalJob } from './assessment-engine';
import { fieldError } from './changes';
import { createEnginePool, type EnginePool, type EnginePoolOptions } from './engine-threads';
import { getExposureGroup } from './exposure-groups';
import { cautions as generalCautions } from './sampling-plans';

/*
 * The group assessment (issue 7): reads a group's valid shift results, runs the statistics engine
 * exactly as `npm run -s assess` does (services/assessment-engine.ts), and answers with every figure
 * of the classical and Bayesian views, the between-worker analysis and the sample planner.
 *
 * The work runs in a pool of worker threads (engine-threads.ts) so the server keeps answering other
 * requests meanwhile, and the figures are kept in an in-memory LRU cache keyed by the data hash — the
 * SHA-256 of the values used, the OEL and every setting (prior, threshold, seed) — so asking again
 * for the same data is instant. What-if exclusions only change which results go in; nothing is written.
 */

/** Bellwether's version (package.json), read once. */
const applicationVersion: string = (JSON.parse(readFileSync(new URL('../../../package.json', import.meta.url), 'utf8')) as { version: string }).version;

export const engineVersion: EngineVersion = Object.freeze({ application: applicationVersion, statistics: STATS_ENGINE_VERSION });

/** The figures of one data hash (what the cache keeps). */
type ComputedFigures =
  | {
      refusal: null;
      figures: Pick<GroupAssessmentResponse, 'classical' | 'report' | 'bayes' | 'betweenWorker' | 'planner' | 'unavailable'>;
      milliseconds: number;
    }
  | { refusal: string; descriptive: AssessmentRefusalDetails['descriptive']; milliseconds: number };

/** The server's statistics threads and the cache of their figures; one per app (createApp). */
export interface AssessmentEngine {
  readonly pool: EnginePool;
  /** Figures for a data hash: cached, or computed once (concurrent requests for one hash share the run). */
  figures(hash: string, compute: () => Promise<ComputedFigures>): { result: Promise<ComputedFigures>; cached: boolean };
  /** Entries in the cache. */
  cacheSize(): number;
  close(): Promise<void>;
}

export interface AssessmentEngineOptions extends EnginePoolOptions {
  /** Figures kept, least recently used dropped first. Default 200. */
  cacheEntries?: number;
}

/** The pool and an LRU cache (a Map in use order: a hit moves its key to the end, the oldest key is dropped first). */
export function createAssessmentEngine(options: AssessmentEngineOptions = {}): AssessmentEngine {
  const pool = createEnginePool(options);
  const capacity = options.cacheEntries ?? 200;
  const cache = new Map<string, Promise<ComputedFigures>>();
  return {
    pool,
    figures(hash, compute) {
      const known = cache.get(hash);
      if (known) {
        cache.delete(hash);
        cache.set(hash, known);
        return { result: known, cached: true };
      }
      const result = compute();
      cache.set(hash, result);
      // A failed run is not kept: the next request tries again.
      result.catch(() => {
        if (cache.get(hash) === result) cache.delete(hash);
      });
      while (cache.size > capacity) cache.delete(cache.keys().next().value as string);
      return { result, cached: false };
    },
    cacheSize: () => cache.size,
    close: () => pool.close(),
  };
}

/** JSON with object keys sorted at every level, so equal content always gives equal text (and hash). */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, item]) => item !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonicalJson(item)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

/**
 * SHA-256 (hex) of the canonical JSON of the values used (worker code, date, value, non-detect flag, in
 * the order the engine receives them), the OEL and action level, and the settings. Result ids are left
 * out: the same measurements entered again give the same hash.
 */
export function assessmentDataHash(input: {
  results: readonly AssessmentResult[];
  oel: number;
  actionLevel: number | null;
  settings: AssessmentSettings;
}): string {
  const document = {
    values: input.results.map((result) => ({ workerCode: result.workerCode, date: result.date, value: result.value, nonDetect: result.nonDetect })),
    oel: input.oel,
    actionLevel: input.actionLevel,
    settings: input.settings,
  };
  return createHash('sha256').update(canonicalJson(document), 'utf8').digest('hex');
}

/** The organization's Bayesian threshold if its settings give a valid one, else the engine default (0.30). */
function unacceptableThresholdOf(db: Db, organizationId: number): Pick<AssessmentSettings, 'unacceptableThreshold' | 'unacceptableThresholdSource'> {
  const row = db.select({ settings: organizations.settings }).from(organizations).where(eq(organizations.id, organizationId)).get();
  const parsed = organizationSettings.shape.bayesUnacceptableThreshold.safeParse(
    (row?.settings as Record<string, unknown> | undefined)?.bayesUnacceptableThreshold,
  );
  return parsed.success && parsed.data !== undefined
    ? { unacceptableThreshold: parsed.data, unacceptableThresholdSource: 'organization' }
    : { unacceptableThreshold: DEFAULT_BAYES_UNACCEPTABLE_THRESHOLD, unacceptableThresholdSource: 'default' };
}

/** The group's valid results in a fixed order (date, worker code, id): the order the engine receives them. */
function validResultsOf(db: Db, groupId: number): AssessmentResult[] {
  return db
    .select({
      id: shiftResults.id,
      workerCode: workers.code,
      date: shiftResults.date,
      value: shiftResults.value,
      nonDetect: shiftResults.nonDetect,
      source: shiftResults.source,
    })
    .from(shiftResults)
    .innerJoin(workers, eq(workers.id, shiftResults.workerId))
    .where(and(eq(shiftResults.exposureGroupId, groupId), eq(shiftResults.status, 'valid')))
    .orderBy(asc(shiftResults.date), asc(workers.code), asc(shiftResults.id))
    .all();
}

const unitLabel = (unit: AssessmentGroup['oelUnit']) => exposureUnitLabels[unit];

/** The hearing conservation trigger for a noise group (PRODUCT.md "Cautions shown in the product"); null otherwise. */
function hearingConservationOf(group: AssessmentGroup, results: readonly AssessmentResult[]): HearingConservationNote | null {
  if (group.agent.kind !== 'noise') return null;
  const usual =
    'The usual trigger is an 8-hour TWA of 85 dB(A), which is a 50 % daily dose under the 90 dB(A) criterion with a 5 dB exchange rate; ' +
    'the regulations that apply set the exact level and what must follow (noise monitoring, audiometric testing, hearing protection, training).';
  if (group.actionLevel === null) {
    return {
      actionLevel: null,
      unit: group.oelUnit,
      statement: `Hearing conservation trigger: no action level is set on this group. ${usual}`,
      resultsAtOrAboveActionLevel: null,
    };
  }
  const level = group.actionLevel;
  const atOrAbove = results.filter((result) => !result.nonDetect && result.value >= level).length;
  return {
    actionLevel: level,
    unit: group.oelUnit,
    statement:
      `Hearing conservation trigger (action level): ${level} ${unitLabel(group.oelUnit)}; ` +
      `${atOrAbove} of the ${results.length} results used ${atOrAbove === 1 ? 'is' : 'are'} at or above it. ${usual}`,
    resultsAtOrAboveActionLevel: atOrAbove,
  };
}

function cautionsOf(group: AssessmentGroup): string[] {
  const list: string[] = [...generalCautions];
  if (group.oelUnit === 'dBA') {
    list.push(
      'These results are in dB(A), which is already a logarithmic scale; the lognormal model behind these statistics is meant for doses and concentrations. Prefer judging noise groups on the daily dose (%).',
    );
  }
  return list;
}

async function computeFigures(pool: EnginePool, name: string, classicalJob: ClassicalJob, bayesJob: BayesJob): Promise<ComputedFigures> {
  const started = performance.now();
  // Classical first (fast): when it refuses the group there is nothing for the Bayesian view and planner to add.
  const classical = await pool.run({ kind: 'classical', job: classicalJob });
  if (classical.refusal !== null) {
    return { refusal: classical.refusal, descriptive: classical.descriptive, milliseconds: performance.now() - started };
  }
  // The two slow parts run side by side, each in its own thread.
  const [bayes, planner] = await Promise.all([pool.run({ kind: 'bayes-view', job: bayesJob }), pool.run({ kind: 'planner', job: bayesJob })]);
  return {
    refusal: null,
    figures: {
      classical: classical.assessment,
      report: reportOf(name, classical.assessment, bayes.view && bayesJob.prior === 'reference' ? bayesFiguresOf(bayes.view) : null),
      bayes: bayes.view,
      betweenWorker: classical.betweenWorker,
      planner: planner.plan,
      unavailable: { bayes: bayes.refusal, betweenWorker: classical.betweenWorkerReason, planner: planner.refusal },
    },
    milliseconds: performance.now() - started,
  };
}

export interface AssessmentInput {
  organizationId: number;
  groupId: number;
  /** Result ids to leave out (what-if); each must be a valid result of the group. */
  exclude: readonly number[];
  prior: PriorName;
}

/**
 * The assessment of one exposure group. 404 for a group of another organization; 400 naming `exclude`
 * for an id that is not a valid result of the group; 422 naming the rule when the group cannot be
 * assessed (e.g. fewer than 3 results), with the group, the data and descriptive statistics in `details`.
 * `report.bayes` holds the command line's Bayesian figures with the reference prior only (the command
 * has no other prior); with another prior it is null and `bayes` holds the view.
 */
export async function getGroupAssessment(db: Db, clock: Clock, engine: AssessmentEngine, input: AssessmentInput): Promise<GroupAssessmentResponse> {
  const view = getExposureGroup(db, clock, input.organizationId, input.groupId);
  const group: AssessmentGroup = {
    id: view.id,
    name: view.name,
    siteName: view.siteName,
    agent: { id: view.agentId, name: view.agentName, kind: view.agentKind },
    oel: view.effectiveOel.value,
    baseOel: view.oelValue,
    oelUnit: view.oelUnit,
    oelSource: view.oelSource,
    oelAveragingTime: view.oelAveragingTime,
    oelStatement: view.effectiveOel.statement,
    actionLevel: view.actionLevel,
    noiseCriteriaSet: view.noiseCriteriaSet,
    dataVersion: view.dataVersion,
  };
  const all = validResultsOf(db, group.id);
  const known = new Set(all.map((result) => result.id));
  const unknown = input.exclude.filter((id) => !known.has(id));
  if (unknown.length > 0) {
    throw fieldError(
      'exclude',
      `${unknown.length === 1 ? 'result' : 'results'} ${unknown.join(', ')} ${unknown.length === 1 ? 'is not a valid result' : 'are not valid results'} of this group`,
      'query',
    );
  }
  const excludedIds = new Set(input.exclude);
  const results = all.filter((result) => !excludedIds.has(result.id));
  const excluded = all.filter((result) => excludedIds.has(result.id));

  const settings: AssessmentSettings = {
    seed: DEFAULT_ASSESSMENT_SEED,
    prior: input.prior,
    ...unacceptableThresholdOf(db, input.organizationId),
    mcmc: { chains: DEFAULT_MCMC_SETTINGS.chains, burnIn: DEFAULT_MCMC_SETTINGS.burnIn, kept: DEFAULT_MCMC_SETTINGS.kept },
    planner: { ...PLANNER_SETTINGS },
  };
  const dataHash = assessmentDataHash({ results, oel: group.oel, actionLevel: group.actionLevel, settings });
  const data: AssessmentData = { results, excluded, excludedIds: [...excludedIds].sort((a, b) => a - b), dataHash };
  const context = {
    group,
    data,
    settings,
    engineVersion,
    cautions: cautionsOf(group),
    hearingConservation: hearingConservationOf(group, results),
  };

  const values: ShiftValue[] = results.map((result) => ({ value: result.value, nonDetect: result.nonDetect, worker: result.workerCode, date: result.date }));
  const classicalJob: ClassicalJob = { values, oel: group.oel, seed: settings.seed, ...(group.actionLevel === null ? {} : { actionLevel: group.actionLevel }) };
  const bayesJob: BayesJob = { values, oel: group.oel, seed: settings.seed, prior: settings.prior, unacceptableThreshold: settings.unacceptableThreshold };
  const { result, cached } = engine.figures(dataHash, () => computeFigures(engine.pool, group.name, classicalJob, bayesJob));
  const computed = await result;
  if (computed.refusal !== null) {
    const details: AssessmentRefusalDetails = { ...context, rule: computed.refusal, descriptive: computed.descriptive };
    throw new Unprocessable(`"${group.name}" cannot be assessed: ${computed.refusal}`, details);
  }
  return { ...context, ...computed.figures, computation: { milliseconds: computed.milliseconds, cached } };
}
