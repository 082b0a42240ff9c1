/**
 * Former address of the `assess --bayes` worker thread. The worker now lives in
 * services/assessment-worker.ts, where the command's batch and the server's pool share it
 * (started by services/engine-threads.ts); nothing starts this file any more.
 */
import '../services/assessment-worker';
