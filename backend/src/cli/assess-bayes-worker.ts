/**
 * Worker thread of `assess --bayes` (see assess-bayes.ts): claims groups from the shared counter,
 * computes their Bayesian figures and posts them, marking each job done (or failed) in the shared array.
 */
import { workerData } from 'node:worker_threads';
import type { MessagePort } from 'node:worker_threads';
import { BAYES_STATUS, bayesFigures, type BayesJob } from './assess-bayes';

const { jobs, shared, port } = workerData as { jobs: BayesJob[]; shared: Int32Array; port: MessagePort };
for (let j = Atomics.add(shared, 0, 1); j < jobs.length; j = Atomics.add(shared, 0, 1)) {
  try {
    port.postMessage({ index: j, figures: bayesFigures(jobs[j]) });
    Atomics.store(shared, 1 + j, BAYES_STATUS.done);
  } catch {
    Atomics.store(shared, 1 + j, BAYES_STATUS.failed);
  }
  Atomics.notify(shared, 1 + j);
}
port.close();
