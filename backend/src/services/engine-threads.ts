/**
 * Worker threads for the statistics engine (issue 4: "The server runs these in a worker thread …, so
 * other requests stay fast while one runs"). One worker module (assessment-worker.ts) serves both users:
 * the assess command's synchronous batch (cli/assess-bayes.ts) and the server's asynchronous pool below.
 */
import os from 'node:os';
import { Worker, type TransferListItem } from 'node:worker_threads';
import type { EngineResults, EngineTask, EngineTaskOf } from './assessment-engine';
import { runEngineTask } from './assessment-engine';

/** Status of a job in the batch's shared array (cli/assess-bayes.ts). */
export const BATCH_STATUS = Object.freeze({ pending: 0, done: 1, failed: 2 });

/** A pool task as posted to a worker, and the worker's answer. */
export interface PoolRequest {
  id: number;
  task: EngineTask;
}
export type PoolReply = { id: number; ok: true; result: unknown } | { id: number; ok: false; message: string };

/**
 * Whether this code runs from the prebuilt command-line bundle (`dist/cli/*.mjs`, built by esbuild in the
 * `assess` and `noise` scripts) rather than from TypeScript sources under tsx or vitest.
 */
const runsFromBundle = import.meta.url.endsWith('.mjs');

/**
 * Start the statistics worker with `workerData`. From the bundle the worker is its sibling
 * `assessment-worker.mjs` and starts at once; from sources (the server under tsx, tests under vitest) the
 * worker first registers tsx and then loads the TypeScript module, which costs a few hundred milliseconds.
 */
export function startEngineWorker(workerData: unknown, transferList: readonly TransferListItem[] = []): Worker {
  if (runsFromBundle) return new Worker(new URL('./assessment-worker.mjs', import.meta.url), { workerData, transferList: [...transferList] });
  const workerModule = new URL('./assessment-worker.ts', import.meta.url).href;
  const bootstrap = `import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(workerModule)}); })`;
  return new Worker(bootstrap, { eval: true, workerData, transferList: [...transferList] });
}

/** Default pool size: at most 2 threads, never more than the machine's cores (issue 7). */
export function defaultPoolSize(): number {
  return Math.max(1, Math.min(2, os.availableParallelism()));
}

export interface EnginePoolOptions {
  /** Worker threads; default min(2, cores). */
  size?: number;
  /** A task running longer than this is stopped (its worker is replaced) and fails. Default 2 minutes. */
  taskTimeoutMs?: number;
  /** Told when the pool falls back to the main thread because workers cannot start. */
  onFallback?: (reason: string) => void;
}

export interface EnginePoolActivity {
  /** Tasks being computed now. */
  running: number;
  /** Tasks waiting for a free thread. */
  queued: number;
  /** Worker threads alive. */
  workers: number;
  /** Of those, threads that have loaded the engine and take tasks. */
  ready: number;
  /** Tasks finished since the pool started. */
  completed: number;
}

/** An asynchronous pool of statistics threads. */
export interface EnginePool {
  readonly size: number;
  run<K extends EngineTask['kind']>(task: EngineTaskOf<K>): Promise<EngineResults[K]>;
  activity(): EnginePoolActivity;
  /** Starts the threads now rather than on the first task (each takes about a second to load the engine). */
  warm(): void;
  /** Stops every worker; queued and running tasks fail. */
  close(): Promise<void>;
}

interface Pending {
  id: number;
  task: EngineTask;
  resolve: (value: unknown) => void;
  reject: (error: Error) => void;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  current: Pending | null;
  timer: NodeJS.Timeout | null;
}

/**
 * A pool of `size` worker threads, started on first use and kept for later tasks. Tasks wait in order
 * of arrival. A worker that dies fails its task and is replaced on the next one. If workers cannot start
 * at all (two start-up failures before any worker was ready), tasks run in the main thread instead:
 * slower for other requests, but the same figures.
 */
export function createEnginePool(options: EnginePoolOptions = {}): EnginePool {
  const size = options.size ?? defaultPoolSize();
  if (!Number.isInteger(size) || size < 1) throw new RangeError(`createEnginePool: size must be an integer ≥ 1, got ${size}`);
  const taskTimeoutMs = options.taskTimeoutMs ?? 120_000;
  const queue: Pending[] = [];
  const slots: Slot[] = [];
  let nextId = 1;
  let completed = 0;
  let inlineRunning = 0;
  let startFailures = 0;
  let everReady = false;
  let inline = false;
  let closed = false;

  const settle = (pending: Pending, reply: PoolReply) => {
    completed++;
    if (reply.ok) pending.resolve(reply.result);
    else pending.reject(new Error(`A statistics task failed in its worker thread: ${reply.message}`));
  };

  const runInline = (pending: Pending) => {
    inlineRunning++;
    setImmediate(() => {
      inlineRunning--;
      try {
        settle(pending, { id: pending.id, ok: true, result: runEngineTask(pending.task) });
      } catch (error) {
        settle(pending, { id: pending.id, ok: false, message: error instanceof Error ? error.message : String(error) });
      }
    });
  };

  const removeSlot = (slot: Slot, why: string) => {
    const index = slots.indexOf(slot);
    if (index < 0) return;
    slots.splice(index, 1);
    if (slot.timer) clearTimeout(slot.timer);
    if (!slot.ready) startFailures++;
    const failed = slot.current;
    slot.current = null;
    if (failed) {
      completed++;
      failed.reject(new Error(`A statistics worker thread stopped: ${why}`));
    }
    if (!everReady && startFailures >= 2 && !inline) {
      inline = true;
      options.onFallback?.(why);
    }
    dispatch();
  };

  const startSlot = () => {
    const worker = startEngineWorker({ mode: 'pool' });
    const slot: Slot = { worker, ready: false, current: null, timer: null };
    slots.push(slot);
    worker.unref();
    worker.on('message', (message: PoolReply | { ready: true }) => {
      if ('ready' in message) {
        slot.ready = true;
        everReady = true;
        dispatch();
        return;
      }
      const pending = slot.current;
      if (!pending || pending.id !== message.id) return;
      slot.current = null;
      if (slot.timer) clearTimeout(slot.timer);
      slot.timer = null;
      worker.unref();
      settle(pending, message);
      dispatch();
    });
    worker.on('error', (error) => removeSlot(slot, error.message));
    worker.on('exit', (code) => removeSlot(slot, `exit code ${code}`));
  };

  function dispatch(): void {
    if (closed) return;
    if (inline) {
      while (queue.length > 0) runInline(queue.shift()!);
      return;
    }
    for (const slot of slots) {
      if (queue.length === 0) return;
      if (!slot.ready || slot.current) continue;
      const pending = queue.shift()!;
      slot.current = pending;
      slot.worker.ref(); // a running task keeps the process alive; an idle pool does not
      slot.timer = setTimeout(() => {
        void slot.worker.terminate();
        removeSlot(slot, `the task took longer than ${taskTimeoutMs / 1000} s`);
      }, taskTimeoutMs);
      slot.timer.unref();
      slot.worker.postMessage({ id: pending.id, task: pending.task } satisfies PoolRequest);
    }
    const idleOrStarting = slots.filter((slot) => !slot.current).length;
    for (let extra = Math.min(queue.length - idleOrStarting, size - slots.length); extra > 0; extra--) startSlot();
  }

  return {
    size,
    run<K extends EngineTask['kind']>(task: EngineTaskOf<K>): Promise<EngineResults[K]> {
      if (closed) return Promise.reject(new Error('The statistics pool is closed'));
      return new Promise<EngineResults[K]>((resolve, reject) => {
        queue.push({ id: nextId++, task: task as EngineTask, resolve: resolve as (value: unknown) => void, reject });
        dispatch();
      });
    },
    warm() {
      if (closed || inline) return;
      while (slots.length < size) startSlot();
    },
    activity() {
      return {
        running: slots.filter((slot) => slot.current).length + inlineRunning,
        queued: queue.length,
        workers: slots.length,
        ready: slots.filter((slot) => slot.ready).length,
        completed,
      };
    },
    async close() {
      closed = true;
      for (const pending of queue.splice(0)) pending.reject(new Error('The statistics pool was closed'));
      const stopping = slots.splice(0).map((slot) => {
        if (slot.timer) clearTimeout(slot.timer);
        slot.current?.reject(new Error('The statistics pool was closed'));
        slot.current = null;
        slot.worker.removeAllListeners('exit');
        return slot.worker.terminate();
      });
      await Promise.all(stopping);
    },
  };
}
