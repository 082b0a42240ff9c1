import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import type BetterSqlite3 from 'better-sqlite3';
import type { NextFunction, Request, Response } from 'express';
import type { Db } from '../db/client';

/*
 * A cache of serialized answers for the heavy read endpoints of a large organization (the dashboard
 * and the exposure-group list; issue "Security, reliability and performance": p95 ≤ 50 ms at 32
 * connections). An answer is kept as JSON bytes (and gzip bytes, made once when a client accepts
 * them) until the data may have changed. "May have changed" is:
 * - any API request other than GET/HEAD finished in this process (every write of the app goes through
 *   one: `readCacheInvalidation`, mounted in app.ts before the routes);
 * - SQLite's `PRAGMA data_version` moved, which it does when another connection (a command line, a
 *   second server) commits to the file.
 * The caller puts everything else the answer depends on (organization, today's date, the query) in the
 * key. Writes that bypass both (a service called directly in the same process, outside a request)
 * are not seen: nothing in the app does that after start-up.
 */

interface Entry {
  version: string;
  json: Buffer;
  gzip: Buffer | null;
  etag: string;
}

interface CacheState {
  generation: number;
  dataVersion: BetterSqlite3.Statement;
  entries: Map<string, Entry>;
}

/** Entries kept per database (least recently used dropped first): a page is tens of KB, a dashboard about 1.5 MB. */
const capacity = 64;
const states = new WeakMap<BetterSqlite3.Database, CacheState>();

function stateOf(db: Db): CacheState {
  let state = states.get(db.$client);
  if (!state) {
    state = { generation: 0, dataVersion: db.$client.prepare('PRAGMA data_version').pluck(), entries: new Map() };
    states.set(db.$client, state);
  }
  return state;
}

/** Forgets every cached answer of this database (called after each write request). */
export function invalidateReadCache(db: Db): void {
  const state = stateOf(db);
  state.generation += 1;
  state.entries.clear();
}

/** Middleware: after any request that may write (not GET/HEAD) has finished, drop the cached answers. */
export function readCacheInvalidation(db: Db) {
  return (req: Request, res: Response, next: NextFunction) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') res.once('close', () => invalidateReadCache(db));
    next();
  };
}

/**
 * Answers with the cached JSON for `key` when the data cannot have changed since it was made, else
 * builds it with `build` and keeps it. gzip when the client accepts it (browsers do; level 6, made
 * once per entry); an ETag so a browser's revalidation gets 304.
 */
export function sendCachedJson(req: Request, res: Response, db: Db, key: string, build: () => unknown): void {
  const state = stateOf(db);
  const version = `${state.generation}:${state.dataVersion.get() as number}`;
  let entry = state.entries.get(key);
  if (entry && entry.version === version) {
    state.entries.delete(key);
    state.entries.set(key, entry);
  } else {
    const json = Buffer.from(JSON.stringify(build()), 'utf8');
    entry = { version, json, gzip: null, etag: `W/"${createHash('sha1').update(json).digest('base64url')}"` };
    state.entries.set(key, entry);
    while (state.entries.size > capacity) state.entries.delete(state.entries.keys().next().value as string);
  }
  res.setHeader('ETag', entry.etag);
  res.setHeader('Vary', 'Accept-Encoding');
  if (req.headers['if-none-match'] === entry.etag) {
    res.status(304).end();
    return;
  }
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  if (entry.json.length > 1024 && req.acceptsEncodings('gzip') === 'gzip') {
    entry.gzip ??= gzipSync(entry.json, { level: 6 });
    res.setHeader('Content-Encoding', 'gzip');
    res.setHeader('Content-Length', entry.gzip.length);
    res.end(entry.gzip);
    return;
  }
  res.setHeader('Content-Length', entry.json.length);
  res.end(entry.json);
}
