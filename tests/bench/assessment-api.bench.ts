/**
 * The assessment API (issue 7; issue 4: "The server runs these in a worker thread and caches them by a
 * hash of the data and settings, so other requests stay fast while one runs"), over HTTP on the demo
 * database:
 * - the first request of a fresh server (worker threads not yet started: their start is included);
 * - a request for new data once the threads run (a what-if exclusion: classical, Bayesian view and planner);
 * - the same request again (from the cache);
 * - GET /api/health while a Bayesian computation runs.
 * No issue gives a number for these, so there are no targets; the rows record what this machine does.
 */
import { createAssessmentEngine } from '../../backend/src/services/assessment';
import { groupId } from '../helpers/org-data';
import { createTestContext } from '../helpers/test-app';
import { loadNote, medianMs, type BenchModule, type BenchRow } from './types';

async function timed<T>(body: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const start = performance.now();
  const value = await body();
  return { ms: performance.now() - start, value };
}

export const run: BenchModule['run'] = async () => {
  const engine = createAssessmentEngine();
  const context = await createTestContext({ assessmentEngine: engine, capture: false });
  try {
    const ridgeback = context.organizationId('ridgeback');
    const analyst = await context.signInAs('analyst');
    const group = groupId(context.db, ridgeback, 'Planer feeder – wood dust');
    const url = (query = '') => `/api/orgs/${ridgeback}/exposure-groups/${group}/assessment${query}`;
    const rows: BenchRow[] = [];

    const first = await timed(() => analyst.get(url()));
    if (first.value.status !== 200) throw new Error(`assessment answered ${first.value.status}`);
    const results = first.value.body.data.results as Array<{ id: number }>;
    rows.push({
      suite: 'api',
      name: 'Assessment, first request of a fresh server (threads start)',
      value: first.ms,
      unit: 'ms',
      note: `${results.length} results with non-detects; computation ${Math.round(first.value.body.computation.milliseconds)} ms; ${loadNote()}`,
    });

    // Both threads loaded (under load the second one can take seconds to start), so the Bayesian view and planner run side by side.
    engine.pool.warm();
    while (engine.pool.activity().ready < engine.pool.size) await new Promise((wait) => setTimeout(wait, 20));
    const cold = await timed(() => analyst.get(url(`?exclude=${results[0].id}`)));
    rows.push({
      suite: 'api',
      name: 'Assessment, new data (what-if), threads running',
      value: cold.ms,
      unit: 'ms',
      note: `cached: ${cold.value.body.computation.cached}`,
    });

    const cached = await medianMs(20, () => analyst.get(url(`?exclude=${results[0].id}`)), 2);
    rows.push({ suite: 'api', name: 'Assessment, same data again (cache)', value: cached, unit: 'ms', note: 'median of 20' });

    // supertest sends a request only once it is awaited or `then` is called.
    let done = false;
    const running = analyst.get(url(`?exclude=${results[1].id}`)).then((answer) => {
      done = true;
      return answer;
    });
    while (engine.pool.activity().running < 2 && !done) await new Promise((wait) => setTimeout(wait, 2));
    const busyBefore = engine.pool.activity().running;
    const anonymous = await context.client();
    const health = await timed(async () => anonymous.agent.get('/api/health'));
    const stillRunning = engine.pool.activity().running;
    const finishedFirst = done;
    await running;
    rows.push({
      suite: 'api',
      name: 'GET /api/health while a Bayesian computation runs',
      value: health.ms,
      unit: 'ms',
      note: `threads busy when it was sent: ${busyBefore}, when it answered: ${stillRunning}; the assessment ${finishedFirst ? 'had' : 'had not'} finished`,
    });
    return rows;
  } finally {
    await context.close();
    await engine.close();
  }
};
