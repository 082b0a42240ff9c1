/**
 * Noise-log benchmarks (issue 5, "Performance"): parse + wear check + figures for 12 h and 40 h
 * logs at 1 s, peak memory of the 40 h run, and a recompute after a mask edit.
 * The logs come from the seeded demo generator (not timed).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeNoiseLog, analyzePreparedNoiseLog, prepareNoiseAnalysis } from '../../stats/noise-analyze';
import { generateNoiseDemoLog } from '../../stats/noise-demo';
import { parseNoiseLog } from '../../stats/noise-log-parse';
import { medianMs, type BenchModule, type BenchRow, cpuMsPerRun, loadNote } from './types';

const megabytes = (bytes: number) => bytes / (1024 * 1024);

function parseAndAnalyze(text: string) {
  return analyzeNoiseLog(parseNoiseLog(text));
}

/** CPU time per run in ms (user + system): less disturbed than wall time when other work shares the machine. */
export const run: BenchModule['run'] = async () => {
  const rows: BenchRow[] = [];
  const twelve = generateNoiseDemoLog({ seed: 12, hours: 12, benchMinutes: 30, knockCount: 5 }).text;
  const forty = generateNoiseDemoLog({ seed: 40, hours: 40, benchMinutes: 60, knockCount: 12 }).text;

  const twelveMs = await medianMs(15, () => parseAndAnalyze(twelve));
  rows.push({
    suite: 'noise',
    name: '12 h log at 1 s (43,200 rows): parse + wear check + figures',
    value: twelveMs,
    unit: 'ms',
    target: 150,
    note: `${(twelve.length / 1e6).toFixed(1)} MB of text, median of 15; CPU ${cpuMsPerRun(5, () => parseAndAnalyze(twelve)).toFixed(0)} ms/run; ${loadNote()}`,
  });

  const fortyMs = await medianMs(7, () => parseAndAnalyze(forty), 2);
  rows.push({
    suite: 'noise',
    name: '40 h log at 1 s (144,000 rows): parse + wear check + figures',
    value: fortyMs / 1000,
    unit: 's',
    target: 0.5,
    note: `${(forty.length / 1e6).toFixed(1)} MB of text, median of 7; CPU ${cpuMsPerRun(3, () => parseAndAnalyze(forty)).toFixed(0)} ms/run; ${loadNote()}`,
  });

  // Peak memory of one 40 h run, measured in a fresh child process so that the generator and the
  // timing runs above do not hide it (see noise-memory-probe.ts).
  const folder = mkdtempSync(path.join(os.tmpdir(), 'noise-bench-'));
  try {
    const file = path.join(folder, 'forty-hours.csv');
    writeFileSync(file, forty);
    const probe = fileURLToPath(new URL('./noise-memory-probe.ts', import.meta.url));
    const output = execFileSync(process.execPath, ['--expose-gc', '--import', 'tsx', probe, file], { encoding: 'utf8' });
    const memory = JSON.parse(output) as {
      rows: number;
      peakHeapGrowthBytes: number;
      retainedHeapBytes: number;
      baselineRssBytes: number;
      peakRssBytes: number;
    };
    rows.push({
      suite: 'noise',
      name: '40 h log: peak memory growth (heap + typed arrays) during parse + compute',
      value: megabytes(memory.peakHeapGrowthBytes),
      unit: 'MB',
      note: `sampled every 5,000 rows; retained after gc ${megabytes(memory.retainedHeapBytes).toFixed(1)} MB; peak RSS ${megabytes(memory.peakRssBytes).toFixed(0)} MB (baseline ${megabytes(memory.baselineRssBytes).toFixed(0)} MB, file text included)`,
    });
  } finally {
    rmSync(folder, { recursive: true, force: true });
  }

  // Recompute after a mask edit on the 12 h log: the review page keeps the prepared analysis.
  const prepared = prepareNoiseAnalysis(parseNoiseLog(twelve));
  let edit = 0;
  const recomputeMs = await medianMs(51, () => {
    edit++;
    const masks = [...prepared.fixed.proposedMasks, { startS: 3600 + edit, endS: 4200 + 2 * edit, reason: 'reviewer' }];
    return analyzePreparedNoiseLog(prepared, masks);
  });
  rows.push({
    suite: 'noise',
    name: 'recompute after a mask edit (12 h log, 43,200 rows)',
    value: recomputeMs,
    unit: 'ms',
    target: 50,
    note: 'median of 51; weights precomputed once',
  });
  return rows;
};
