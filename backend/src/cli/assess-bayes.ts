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
import { MessageChannel, receiveMessageOnPort, type MessagePort, type Worker } from 'node:worker_threads';
import { bayesFigures, type AssessBayesFigures, type BayesJob } from '../services/assessment-engine';
import { BATCH_STATUS, startEngineWorker } from '../services/engine-threads';

// The figures and their computation live in services/assessment-engine.ts, shared with the API.
export { bayesFigures, type AssessBayesFigures, type BayesInterval, type BayesJob } from '../services/assessment-engine';

/** Below this many groups, starting workers (about 0.3 s each) costs more than it saves. */
const MIN_GROUPS_FOR_WORKERS = 4;
const STATUS_PENDING = BATCH_STATUS.pending;
const STATUS_DONE = BATCH_STATUS.done;

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
  for (let w = 0; w < workerCount; w++) {
    const { port1, port2 } = new MessageChannel();
    // The worker module (services/assessment-worker.ts) in batch mode; engine-threads.ts registers tsx for it.
    const worker = startEngineWorker({ mode: 'batch', jobs, shared, port: port2 }, [port2]);
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
