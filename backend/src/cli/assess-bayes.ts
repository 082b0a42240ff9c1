/**
 * The `bayes` figures of `npm run -s assess -- --bayes` (PRODUCT.md, "Command-line contracts"): the
 * Bayesian view (stats/bayes-view.ts) with the reference prior, 4 chains × 25,000 kept draws after
 * 5,000 burn-in, seeded by --seed.
 *
 * Many groups are shared between the main thread and worker threads (issue 4: 20 groups in ≤ 3 s end
 * to end). The command stays synchronous: workers are started before the classical figures are
 * computed, every thread claims groups from one shared counter (Atomics), workers post their figures
 * on a MessagePort, and the main thread, once its own share is done, waits with Atomics.wait and reads
 * the port with receiveMessageOnPort. A worker that cannot start claims nothing, so the main thread
 * simply does more; a group a worker fails on is recomputed in the main thread. Results do not depend
 * on which thread computed them: each group's chains are seeded from --seed alone.
 */
import os from 'node:os';
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import { bayesianView, toAssessBayesOutput } from '@stats/bayes-view';
import type { ShiftValue } from '@stats/types';

export interface BayesInterval {
  median: number;
  lower: number;
  upper: number;
  q95: number;
}

/** The Bayesian figures of one group as printed by the command (PRODUCT.md). */
export interface AssessBayesFigures {
  gm: BayesInterval;
  gsd: BayesInterval;
  p95: BayesInterval;
  exceedanceFraction: BayesInterval;
  categoryProbabilities: [number, number, number, number, number];
}

export interface BayesJob {
  values: readonly ShiftValue[];
  oel: number;
  seed: number;
}

/** The figures of one group, computed in this thread; null when the Bayesian view refuses the data. */
export function bayesFigures(job: BayesJob): AssessBayesFigures | null {
  try {
    const figures = toAssessBayesOutput(bayesianView(job.values, { oel: job.oel, prior: { kind: 'reference' }, settings: { seed: job.seed } }));
    if (figures.exceedanceFraction === null || figures.categoryProbabilities === null) return null;
    return { ...figures, exceedanceFraction: figures.exceedanceFraction, categoryProbabilities: figures.categoryProbabilities };
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
}

/** Below this many groups, starting workers (about 0.3 s each) costs more than it saves. */
const MIN_GROUPS_FOR_WORKERS = 4;
const STATUS_PENDING = 0;
const STATUS_DONE = 1;
const STATUS_FAILED = 2;

/** Figures being computed for a list of jobs; `take` returns job j's figures (blocking until ready). */
export interface BayesBatch {
  take(index: number): AssessBayesFigures | null;
  /** Let the main thread compute its share; call after the other work of the command. */
  finish(): void;
}

/**
 * Start computing the figures of `jobs`: in worker threads as well as this one when `useWorkers` is
 * true and there are enough groups, otherwise in this thread on demand.
 */
export function startBayesBatch(jobs: readonly BayesJob[], useWorkers: boolean): BayesBatch {
  const workerCount = Math.min(os.availableParallelism(), Math.ceil(jobs.length / 2));
  if (!useWorkers || jobs.length < MIN_GROUPS_FOR_WORKERS || workerCount < 1) {
    const cache = new Map<number, AssessBayesFigures | null>();
    return {
      take(index) {
        if (!cache.has(index)) cache.set(index, bayesFigures(jobs[index]));
        return cache.get(index) ?? null;
      },
      finish() {},
    };
  }
  // [0] next unclaimed job; [1 + j] status of job j.
  const shared = new Int32Array(new SharedArrayBuffer(4 * (1 + jobs.length)));
  const results = new Map<number, AssessBayesFigures | null>();
  const ports: MessagePort[] = [];
  const workers: Worker[] = [];
  const target = new URL('./assess-bayes-worker.ts', import.meta.url).href;
  for (let w = 0; w < workerCount; w++) {
    const { port1, port2 } = new MessageChannel();
    // The worker registers tsx (the command runs under it) and loads the TypeScript worker module.
    const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(target)}); })`;
    const worker = new Worker(bootstrap, { eval: true, workerData: { jobs, shared, port: port2 }, transferList: [port2] });
    worker.on('error', () => {}); // a worker that fails to start claims no job; this thread does the work
    worker.unref();
    ports.push(port1);
    workers.push(worker);
  }
  const drain = () => {
    for (const port of ports) {
      for (let message = receiveMessageOnPort(port); message; message = receiveMessageOnPort(port)) {
        const { index, figures } = message.message as { index: number; figures: AssessBayesFigures | null };
        results.set(index, figures);
      }
    }
  };
  let finished = false;
  const finish = () => {
    if (finished) return;
    finished = true;
    for (let j = Atomics.add(shared, 0, 1); j < jobs.length; j = Atomics.add(shared, 0, 1)) {
      results.set(j, bayesFigures(jobs[j]));
      Atomics.store(shared, 1 + j, STATUS_DONE);
    }
  };
  return {
    finish,
    take(index) {
      finish();
      if (results.has(index)) return results.get(index) ?? null;
      // Claimed by a worker: wait for it (at most 2 minutes, then compute here).
      const deadline = Date.now() + 120_000;
      while (Atomics.load(shared, 1 + index) === STATUS_PENDING && Date.now() < deadline) Atomics.wait(shared, 1 + index, STATUS_PENDING, 50);
      drain();
      if (Atomics.load(shared, 1 + index) !== STATUS_DONE || !results.has(index)) results.set(index, bayesFigures(jobs[index]));
      if (results.size === jobs.length) for (const worker of workers) void worker.terminate();
      return results.get(index) ?? null;
    },
  };
}

export const BAYES_STATUS = Object.freeze({ pending: STATUS_PENDING, done: STATUS_DONE, failed: STATUS_FAILED });
