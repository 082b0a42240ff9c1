import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';

/*
 * Reads the built client (dist/client, or CLIENT_DIR as vite.config.ts and the server do) for the
 * bundle budget (tests/e2e/bundle-budget.test.ts) and its benchmark (tests/bench/bundle.bench.ts).
 * Sizes are gzip at level 9, as a CDN or a pre-compressing server would send them (common practice:
 * static assets are compressed once, at the highest level; a server compressing on the fly at level 6
 * sends a few per cent more).
 */

const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/** Where the built client is: CLIENT_DIR, else dist/client. */
export function clientDirectory(): string {
  return process.env.CLIENT_DIR ?? path.join(projectRoot, 'dist/client');
}

/**
 * Strings found in Plotly's code and in nothing of ours (plotly.js-dist-min 4.1.2: the class of its
 * mode-bar logo and the name of its global configuration). One is enough to mark a chunk as Plotly.
 */
export const plotlySignatures = ['plotly-logomark', 'PlotlyConfig'] as const;

export interface ClientChunk {
  /** Path under the client folder, e.g. "assets/index-abc123.js". */
  file: string;
  bytes: number;
  gzipBytes: number;
  /** Loaded by index.html (the entry script or a modulepreload link). */
  initial: boolean;
  plotly: boolean;
}

export interface ClientBundle {
  directory: string;
  chunks: ClientChunk[];
  initial: ClientChunk[];
  initialGzipBytes: number;
}

/** Script and modulepreload URLs of index.html, as paths under the client folder. */
export function initialScripts(html: string): string[] {
  const found = new Set<string>();
  for (const tag of html.match(/<script\b[^>]*>/g) ?? []) {
    const source = /\bsrc="([^"]+)"/.exec(tag)?.[1];
    if (source) found.add(source);
  }
  for (const tag of html.match(/<link\b[^>]*>/g) ?? []) {
    if (!/\brel="modulepreload"/.test(tag)) continue;
    const href = /\bhref="([^"]+)"/.exec(tag)?.[1];
    if (href) found.add(href);
  }
  return [...found].filter((url) => !/^[a-z]+:\/\//i.test(url)).map((url) => url.replace(/^\.?\//, ''));
}

/** Every JavaScript chunk of the build with its raw and gzip size, and which ones index.html loads. */
export function readClientBundle(directory = clientDirectory()): ClientBundle {
  const html = readFileSync(path.join(directory, 'index.html'), 'utf8');
  const initialFiles = new Set(initialScripts(html));
  if (initialFiles.size === 0) throw new Error(`${directory}/index.html loads no script: is this a Vite build?`);
  const assets = path.join(directory, 'assets');
  const chunks = readdirSync(assets)
    .filter((name) => name.endsWith('.js'))
    .map((name): ClientChunk => {
      const file = `assets/${name}`;
      const content = readFileSync(path.join(assets, name));
      const text = content.toString('utf8');
      return {
        file,
        bytes: content.length,
        gzipBytes: gzipSync(content, { level: 9 }).length,
        initial: initialFiles.has(file),
        plotly: plotlySignatures.some((signature) => text.includes(signature)),
      };
    });
  for (const file of initialFiles) {
    if (!chunks.some((chunk) => chunk.file === file)) throw new Error(`index.html loads ${file}, which is not a .js file in ${assets}`);
  }
  const initial = chunks.filter((chunk) => chunk.initial);
  return { directory, chunks, initial, initialGzipBytes: initial.reduce((sum, chunk) => sum + chunk.gzipBytes, 0) };
}
