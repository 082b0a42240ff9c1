/**
 * Child process of noise.bench.ts: reads one noise log file, parses and analyses it the way
 * parseNoiseLog does (papaparse step → NoiseLogReader), sampling the heap every 5,000 rows, and
 * prints the growth of heap + external memory (peak and retained) and the peak RSS as JSON. Run with --expose-gc so
 * the baseline is measured after a collection. Not a benchmark module itself (no .bench.ts).
 */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { analyzeNoiseLog } from '../../stats/noise-analyze';
import { NoiseLogReader } from '../../stats/noise-log-parse';

const file = process.argv[2];
if (!file) throw new Error('usage: noise-memory-probe.ts LOG.csv');
const text = readFileSync(file, 'utf8');
const gc = (globalThis as { gc?: () => void }).gc;
gc?.();
const baseline = process.memoryUsage();
// Typed-array storage lives outside the V8 heap (memoryUsage().external), so both are counted.
const used = (usage: NodeJS.MemoryUsage) => usage.heapUsed + usage.external;
let peakHeap = used(baseline);
const sample = () => {
  peakHeap = Math.max(peakHeap, used(process.memoryUsage()));
};

const reader = new NoiseLogReader();
let rows = 0;
Papa.parse<string[]>(text, {
  delimiter: ',',
  skipEmptyLines: false,
  step: (results) => {
    reader.pushRow(results.data);
    if (++rows % 5000 === 0) sample();
  },
});
sample();
const log = reader.finish();
sample();
const analysis = analyzeNoiseLog(log);
sample();
gc?.();
const retained = used(process.memoryUsage()) - used(baseline);
const maxRssKiB = process.resourceUsage().maxRSS;
process.stdout.write(
  JSON.stringify({
    rows: log.length,
    runSeconds: analysis.runSeconds,
    gcAvailable: gc !== undefined,
    peakHeapGrowthBytes: peakHeap - used(baseline),
    retainedHeapBytes: retained,
    baselineRssBytes: baseline.rss,
    peakRssBytes: maxRssKiB * 1024,
  }),
);
