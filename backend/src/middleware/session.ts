import type { Request, Response } from 'express';
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

// The package's declaration (types/jstat.d.ts) types the class as the abstract Store; it does
// implement get/set/destroy, which a subclass must be able to see.
type ConcreteStore = new (options: { client: Db['$client'] }) => session.Store &
  Pick<session.MemoryStore, 'get' | 'set' | 'destroy'>;
const SqliteStore = sqliteStoreFactory(session) as unknown as ConcreteStore;

/**
 * better-sqlite3-session-store starts a 15-minute clean-up timer it never stops; this subclass
 * keeps the timer from holding the process open and stops it on close (server shutdown, tests).
 */
class ClosableSqliteStore extends SqliteStore {
  // `declare`: the base constructor calls startInterval() before subclass fields would be
  // initialised, and an initialised field would wipe the timer it set.
  declare private timer: NodeJS.Timeout | undefined;

  /** Replaces the base class's timer (called from its constructor). */
  startInterval() {
    const base = this as unknown as { clearExpiredSessions(): void; expired: { intervalMs: number } };
    this.timer = setInterval(() => base.clearExpiredSessions(), base.expired.intervalMs);
    this.timer.unref();
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
