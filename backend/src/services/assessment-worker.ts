/**
 * The statistics worker thread, started by startEngineWorker (engine-threads.ts) in one of two modes:
 * - `batch` (`npm run -s assess -- --bayes`, cli/assess-bayes.ts): claims groups from the shared counter,
 *   computes their Bayesian figures and posts them, marking each job done (or failed) in the shared array;
 * - `pool` (the server, engine-threads.ts createEnginePool): answers one task message at a time with its
 *   result, so Bayesian runs and the sample planner never hold up the server's main thread.
 * Both run the same functions (assessment-engine.ts) as the main thread would.
 */
import { parentPort, workerData, type MessagePort } from 'node:worker_threads';
import { bayesFigures, runEngineTask, type BayesJob, type EngineTask } from './assessment-engine';
import { BATCH_STATUS, type PoolReply, type PoolRequest } from './engine-threads';

type WorkerData = { mode: 'batch'; jobs: BayesJob[]; shared: Int32Array; port: MessagePort } | { mode: 'pool' };

const data = workerData as WorkerData;
if (data.mode === 'batch') {
  const { jobs, shared, port } = data;
  for (let j = Atomics.add(shared, 0, 1); j < jobs.length; j = Atomics.add(shared, 0, 1)) {
    try {
      port.postMessage({ index: j, figures: bayesFigures(jobs[j]) });
      Atomics.store(shared, 1 + j, BATCH_STATUS.done);
    } catch {
      Atomics.store(shared, 1 + j, BATCH_STATUS.failed);
    }
    Atomics.notify(shared, 1 + j);
  }
  port.close();
} else {
  const port = parentPort;
  if (!port) throw new Error('assessment-worker: pool mode needs a parent port');
  port.on('message', (request: PoolRequest) => {
    let reply: PoolReply;
    try {
      reply = { id: request.id, ok: true, result: runEngineTask(request.task as EngineTask) };
    } catch (error) {
      reply = { id: request.id, ok: false, message: error instanceof Error ? (error.stack ?? error.message) : String(error) };
    }
    port.postMessage(reply);
  });
  port.postMessage({ ready: true });
}
