import os from 'node:os';

/** One line of the benchmark table printed by `npm run bench` and written to bench-results/latest.json. */
export interface BenchRow {
  suite: 'statistics' | 'bayes' | 'noise' | 'api' | 'bundle' | string;
  name: string;
  value: number;
  unit: 'ms' | 's' | 'MB' | 'KB' | 'count' | string;
  /** The target from the issue, in the same unit; omitted when there is none. */
  target?: number;
  /** 'max' (default): value must be ≤ target; 'min': value must be ≥ target. */
  direction?: 'max' | 'min';
  note?: string;
}

/** A bench module exports `run`, which measures and returns its rows. It must stop by itself. */
export type BenchModule = { run: () => Promise<BenchRow[]> };

/** Median of repeated timings in milliseconds, after a warm-up. */
export async function medianMs(repeats: number, body: () => unknown | Promise<unknown>, warmup = 3): Promise<number> {
  for (let i = 0; i < warmup; i++) await body();
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    await body();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  const mid = Math.floor(times.length / 2);
  return times.length % 2 ? times[mid] : (times[mid - 1] + times[mid]) / 2;
}

/** CPU time (user + system) per run in milliseconds: steadier than wall time on a shared machine. */
export function cpuMsPerRun(repeats: number, body: () => unknown): number {
  const start = process.cpuUsage();
  for (let i = 0; i < repeats; i++) body();
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1000 / repeats;
}

/** The machine's one-minute load, for the note of a row measured while others may be running. */
export function loadNote(): string {
  return `load average ${os.loadavg()[0].toFixed(1)} on ${os.cpus().length} CPUs`;
}
