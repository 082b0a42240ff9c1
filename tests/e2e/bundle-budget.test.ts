/**
 * Client budget (issue "Security, reliability and performance"): the JavaScript a first page load
 * fetches — index.html's entry script and its modulepreload links — is at most 250 KB gzip, and
 * Plotly's code sits only in chunks loaded later (the chart pages' lazy chunks). Runs on the build
 * output (`npm run build`, or CLIENT_DIR); gzip level 9 as a CDN would serve it (tests/helpers/client-bundle.ts).
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { clientDirectory, initialScripts, readClientBundle } from '../helpers/client-bundle';

const budgetBytes = 250 * 1024;
const directory = clientDirectory();
if (!existsSync(path.join(directory, 'index.html'))) throw new Error(`No built client in ${directory}: run \`npm run build\` first (or set CLIENT_DIR)`);
const bundle = readClientBundle(directory);

describe('client bundle budget', () => {
  it('reads the entry script and modulepreload links of index.html', () => {
    const html = [
      '<script type="module" crossorigin src="/assets/index-a1.js"></script>',
      '<link rel="modulepreload" crossorigin href="/assets/vendor-b2.js">',
      '<link rel="stylesheet" crossorigin href="/assets/index-c3.css">',
      '<script src="https://elsewhere.example/x.js"></script>',
    ].join('\n');
    expect(initialScripts(html)).toEqual(['assets/index-a1.js', 'assets/vendor-b2.js']);
  });

  it('loads at most 250 KB of gzip JavaScript on the first page', () => {
    const listing = bundle.initial.map((chunk) => `${chunk.file} ${(chunk.gzipBytes / 1024).toFixed(1)} KB`).join(', ');
    expect(bundle.initial.length, 'index.html loads at least its entry script').toBeGreaterThan(0);
    expect(bundle.initialGzipBytes, `initial JavaScript: ${listing}`).toBeLessThanOrEqual(budgetBytes);
  });

  it('keeps Plotly out of the initial load, in lazy chunks only', () => {
    const plotly = bundle.chunks.filter((chunk) => chunk.plotly);
    // The chart pages use Plotly, so the build must contain it somewhere: otherwise the signature is stale.
    expect(plotly.length, 'a chunk with Plotly’s code (see plotlySignatures)').toBeGreaterThan(0);
    expect(plotly.filter((chunk) => chunk.initial).map((chunk) => chunk.file)).toEqual([]);
  });
});
