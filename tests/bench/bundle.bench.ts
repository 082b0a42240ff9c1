/**
 * Client bundle sizes (issue "Security, reliability and performance": initial JavaScript ≤ 250 KB gzip,
 * Plotly only in the chart pages' chunks), read from the build output (dist/client or CLIENT_DIR; run
 * `npm run build` first). gzip level 9, as a CDN would serve the files (tests/helpers/client-bundle.ts).
 * The pass/fail check is tests/e2e/bundle-budget.test.ts; these rows record the figures.
 */
import { statSync } from 'node:fs';
import path from 'node:path';
import { readClientBundle } from '../helpers/client-bundle';
import type { BenchModule, BenchRow } from './types';

const kilobytes = (bytes: number) => bytes / 1024;

export const run: BenchModule['run'] = async () => {
  const bundle = readClientBundle();
  const built = statSync(path.join(bundle.directory, 'index.html')).mtime.toISOString();
  const lazy = bundle.chunks.filter((chunk) => !chunk.initial && !chunk.plotly).sort((a, b) => b.gzipBytes - a.gzipBytes);
  const plotly = bundle.chunks.filter((chunk) => chunk.plotly);
  const rows: BenchRow[] = [
    {
      suite: 'bundle',
      name: `initial JavaScript (entry + ${bundle.initial.length - 1} modulepreload), gzip`,
      value: kilobytes(bundle.initialGzipBytes),
      unit: 'KB',
      target: 250,
      note: `${kilobytes(bundle.initial.reduce((sum, chunk) => sum + chunk.bytes, 0)).toFixed(0)} KB raw; build of ${built}`,
    },
    {
      suite: 'bundle',
      name: 'Plotly chunks loaded initially',
      value: plotly.filter((chunk) => chunk.initial).length,
      unit: 'count',
      target: 0,
      note: `${plotly.length} chunk(s) with Plotly: ${plotly.map((chunk) => chunk.file).join(', ') || 'none found'}`,
    },
  ];
  if (lazy.length > 0) {
    rows.push({
      suite: 'bundle',
      name: `largest lazy chunk other than Plotly (${lazy[0].file}), gzip`,
      value: kilobytes(lazy[0].gzipBytes),
      unit: 'KB',
      note: `${lazy.length} lazy chunks besides Plotly's`,
    });
  }
  for (const chunk of plotly) {
    rows.push({
      suite: 'bundle',
      name: `Plotly chunk ${chunk.file}, gzip`,
      value: kilobytes(chunk.gzipBytes),
      unit: 'KB',
      note: `${kilobytes(chunk.bytes).toFixed(0)} KB raw; loaded only by the chart pages`,
    });
  }
  return rows;
};
