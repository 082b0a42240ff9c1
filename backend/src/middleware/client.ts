import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express } from 'express';

/**
 * Serves the built single-page app from `clientDir` (vite build → dist/client). Hashed files in
 * assets/ are cached for a year (their names change with their content); index.html is never
 * cached. Every other GET outside /api gets index.html (history fallback for client-side routes).
 * Without a build, those requests answer 503 with how to build it.
 */
export function serveClient(app: Express, clientDir: string): void {
  const indexFile = join(clientDir, 'index.html');
  app.use('/assets', express.static(join(clientDir, 'assets'), { immutable: true, maxAge: '365d', index: false, fallthrough: false }));
  app.use(express.static(clientDir, { index: false, maxAge: 0 }));
  app.get('/{*splat}', (_req, res) => {
    if (!existsSync(indexFile)) {
      res.status(503).type('text/plain').send('The client has not been built yet. Run `npm run build` (npm start builds it for you), then reload.\n');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
}
