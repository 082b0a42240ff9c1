import type { Request, Response } from 'express';
import type { Statement } from 'better-sqlite3';
import session from 'express-session';
import sqliteStoreFactory from 'better-sqlite3-session-store';
import type { AppConfig } from '../config';
import type { Db } from '../db/client';
import { renewCsrfToken } from './csrf';

declare module 'express-session' {
  interface SessionData {
    /** The signed-in user's id; absent before sign-in. */
    userId: number;
    /** The CSRF synchronizer token (middleware/csrf.ts). */
    csrfToken: string;
  }
}

// The package ships no types (types/ declares it as the abstract Store); this is what its class implements.
type StoreCallback = (error?: unknown) => void;
interface SqliteStoreInstance extends session.Store {
  get(sid: string, callback: (error: unknown, data?: session.SessionData | null) => void): void;
  set(sid: string, data: session.SessionData, callback?: StoreCallback): void;
  destroy(sid: string, callback?: StoreCallback): void;
  touch(sid: string, data: session.SessionData, callback?: StoreCallback): void;
}
type ConcreteStore = new (options: { client: Db['$client'] }) => SqliteStoreInstance;
const SqliteStore = sqliteStoreFactory(session) as unknown as ConcreteStore;

/** A rolling session's stored expiry is pushed out at most this often (the cookie's on every response). */
const TOUCH_INTERVAL_MS = 60_000;

/**
 * better-sqlite3-session-store, made cheaper per request and stoppable:
 * - the package prepares its SQL on every call; `get` and `touch` here keep one prepared statement each
 *   (same SQL as the package);
 * - with `rolling: true` express-session touches the stored session on every request; here a session's
 *   expiry is written at most once a minute, so a page's burst of reads does not write to the database
 *   each time (the stored expiry may lag the cookie's by up to a minute, against a 12-hour lifetime);
 * - the package starts a 15-minute clean-up timer it never stops; this keeps the timer from holding the
 *   process open and stops it on close (server shutdown, tests).
 */
class ClosableSqliteStore extends SqliteStore {
  // `declare`: the base constructor calls startInterval() before subclass fields would be
  // initialised, and an initialised field would wipe the timer it set.
  declare private timer: NodeJS.Timeout | undefined;
  private readonly client: Db['$client'];
  private readonly lastTouch = new Map<string, number>();
  private selectSession: Statement<unknown[]> | undefined;
  private updateExpiry: Statement<unknown[]> | undefined;
  private deleteSession: Statement<unknown[]> | undefined;

  constructor(options: { client: Db['$client'] }) {
    super(options);
    this.client = options.client;
  }

  /** Replaces the base class's timer (called from its constructor). */
  startInterval() {
    const base = this as unknown as { clearExpiredSessions(): void; expired: { intervalMs: number } };
    this.timer = setInterval(() => base.clearExpiredSessions(), base.expired.intervalMs);
    this.timer.unref();
  }

  override get(sid: string, callback: (error: unknown, data?: session.SessionData | null) => void) {
    try {
      this.selectSession ??= this.client.prepare("SELECT sess FROM sessions WHERE sid = ? AND datetime('now') < datetime(expire)");
      const row = this.selectSession.get(sid) as { sess: string } | undefined;
      callback(null, row?.sess ? (JSON.parse(row.sess) as session.SessionData) : null);
    } catch (error) {
      callback(error);
    }
  }

  override touch(sid: string, data: session.SessionData, callback?: StoreCallback) {
    const now = Date.now();
    if (now - (this.lastTouch.get(sid) ?? 0) < TOUCH_INTERVAL_MS) return callback?.();
    try {
      const expires = data.cookie?.expires ? new Date(data.cookie.expires) : new Date(now + 86_400_000);
      this.updateExpiry ??= this.client.prepare("UPDATE sessions SET expire = ? WHERE sid = ? AND datetime('now') < datetime(expire)");
      this.updateExpiry.run(expires.toISOString(), sid);
      if (this.lastTouch.size > 10_000) this.lastTouch.clear(); // bounded: forgetting only means one more write
      this.lastTouch.set(sid, now);
      callback?.();
    } catch (error) {
      callback?.(error);
    }
  }

  override destroy(sid: string, callback?: StoreCallback) {
    this.lastTouch.delete(sid);
    try {
      this.deleteSession ??= this.client.prepare('DELETE FROM sessions WHERE sid = ?');
      this.deleteSession.run(sid);
      callback?.();
    } catch (error) {
      callback?.(error);
    }
  }

  close() {
    if (this.timer) clearInterval(this.timer);
  }
}

export const sessionCookieName = 'bellwether.sid';

/**
 * Sessions in the app's own SQLite file (table `sessions`). Cookie: httpOnly, SameSite=Lax,
 * Secure in production (behind a TLS proxy set TRUST_PROXY so Express sees https). Rolling:
 * each request pushes the expiry out by `sessionMaxAgeMs`. No session is stored until something
 * is put in it (a CSRF token or a sign-in).
 */
export function createSessionMiddleware(db: Db, config: AppConfig) {
  const store = new ClosableSqliteStore({ client: db.$client });
  const middleware = session({
    name: sessionCookieName,
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.nodeEnv === 'production',
      maxAge: config.sessionMaxAgeMs,
      path: '/',
    },
  });
  return { middleware, close: () => store.close() };
}

/**
 * Signs a user in: replaces the session (new id, so an id planted before sign-in is useless —
 * session fixation), stores the user id and a fresh CSRF token, and saves. Returns the token.
 */
export function startUserSession(req: Request, userId: number): Promise<string> {
  return new Promise((resolve, reject) => {
    req.session.regenerate((regenerateError) => {
      if (regenerateError) return reject(regenerateError);
      req.session.userId = userId;
      const token = renewCsrfToken(req);
      req.session.save((saveError) => (saveError ? reject(saveError) : resolve(token)));
    });
  });
}

/** Signs out: deletes the stored session and tells the browser to drop the cookie. */
export function endUserSession(req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.destroy((error) => {
      if (error) return reject(error);
      res.clearCookie(sessionCookieName, { path: '/' });
      resolve();
    });
  });
}
