import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

/** A fixed-window limit: at most `limit` counted requests per `windowMs` per key. */
export interface RateLimit {
  limit: number;
  windowMs: number;
}

export interface RateLimits {
  /** Failed sign-ins per IP address + e-mail address. */
  signIn: RateLimit;
  /** Failed sign-ins per IP address, whatever the e-mail (slows guessing across many accounts). */
  signInPerAddress: RateLimit;
  /** Reset e-mails asked for per IP address + e-mail address. */
  forgotPassword: RateLimit;
  /** Failed reset-password attempts (bad token) and failed invitation acceptances, per IP address. */
  resetPassword: RateLimit;
}

export interface AppConfig {
  nodeEnv: 'development' | 'production' | 'test';
  port: number;
  /** Public address used in e-mailed links, without a trailing slash. */
  appUrl: string;
  databasePath: string;
  /** Signs the session cookie. Several secrets: the first signs, all verify (rotation). */
  sessionSecret: string | string[];
  /** Session lifetime (rolling: each request extends it). */
  sessionMaxAgeMs: number;
  /** Express 'trust proxy': false, a hop count, or addresses/subnets ('loopback'). Never `true`. */
  trustProxy: false | number | string;
  logLevel: string;
  mailFrom: string;
  /** Folder with the built client (vite build → dist/client). */
  clientDir: string;
  jsonLimit: string;
  rateLimits: RateLimits;
}

const minutes = (count: number) => count * 60_000;

/**
 * Documented limits (docs/decisions/005-sessions-csrf-and-auth.md): 5 failed sign-ins per
 * 15 min per IP + e-mail, 50 per IP; 5 reset e-mails per 15 min per IP + e-mail; 10 bad reset
 * tokens per 15 min per IP. Tests pass smaller windows through `createApp`'s config.
 */
export const defaultRateLimits: RateLimits = {
  signIn: { limit: 5, windowMs: minutes(15) },
  signInPerAddress: { limit: 50, windowMs: minutes(15) },
  forgotPassword: { limit: 5, windowMs: minutes(15) },
  resetPassword: { limit: 10, windowMs: minutes(15) },
};

const projectRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

const environment = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_PATH: z.string().min(1).default('data/bellwether.db'),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters').optional(),
  SMTP_URL: z.url().optional(),
  APP_URL: z.url().optional(),
  MAIL_FROM: z.string().min(3).default('Bellwether <no-reply@bellwether.localhost>'),
  /** Folder with the built client; defaults to dist/client (vite.config.ts reads the same variable). */
  CLIENT_DIR: z.string().min(1).optional(),
  TRUST_PROXY: z.string().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
  SESSION_HOURS: z.coerce
    .number()
    .positive()
    .max(24 * 30)
    .default(12),
  DEMO_PASSWORD: z.string().min(10, 'DEMO_PASSWORD must be at least 10 characters').default('bellwether-demo'),
  SEED_DEMO: z.enum(['true', 'false', '1', '0']).default('true'),
  VITEST: z.string().optional(),
});

/** Everything server.ts reads from the environment, checked; bad values stop the start with their names. */
export interface ServerSettings {
  config: Omit<AppConfig, 'sessionSecret'>;
  sessionSecret?: string;
  smtpUrl?: string;
  demoPassword: string;
  seedDemo: boolean;
}

function parseTrustProxy(value: string | undefined): AppConfig['trustProxy'] {
  if (value === undefined || value === '' || value === 'false') return false;
  if (/^\d+$/.test(value)) return Number(value);
  // 'true' would let any client choose its address and walk past the rate limits.
  if (value === 'true') throw new Error('TRUST_PROXY=true is unsafe; give the number of proxies (1) or their addresses (loopback)');
  return value;
}

/** Reads and checks the environment. Throws an Error naming each bad variable. */
export function loadSettings(env: NodeJS.ProcessEnv = process.env): ServerSettings {
  const parsed = environment.safeParse(env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Bad configuration: ${problems.join('; ')}`);
  }
  const values = parsed.data;
  const testing = values.NODE_ENV === 'test' || values.VITEST !== undefined;
  return {
    config: {
      nodeEnv: values.NODE_ENV,
      port: values.PORT,
      appUrl: (values.APP_URL ?? `http://localhost:${values.PORT}`).replace(/\/+$/, ''),
      databasePath: values.DATABASE_PATH,
      sessionMaxAgeMs: values.SESSION_HOURS * 3_600_000,
      trustProxy: parseTrustProxy(values.TRUST_PROXY),
      logLevel: values.LOG_LEVEL ?? (testing ? 'silent' : 'info'),
      mailFrom: values.MAIL_FROM,
      clientDir: values.CLIENT_DIR ?? join(projectRoot, 'dist/client'),
      jsonLimit: '1mb',
      rateLimits: defaultRateLimits,
    },
    sessionSecret: values.SESSION_SECRET,
    smtpUrl: values.SMTP_URL,
    demoPassword: values.DEMO_PASSWORD,
    seedDemo: values.SEED_DEMO === 'true' || values.SEED_DEMO === '1',
  };
}

/**
 * The session secret when SESSION_SECRET is unset: a random 32-byte secret kept in
 * `<data folder>/session-secret` (mode 0600), made on first start, so sessions survive restarts.
 * Returns whether it was just created, for the start-up warning.
 */
export function persistedSessionSecret(dataFolder: string): { secret: string; created: boolean; path: string } {
  const path = join(dataFolder, 'session-secret');
  if (existsSync(path)) {
    const secret = readFileSync(path, 'utf8').trim();
    if (secret.length >= 32) return { secret, created: false, path };
  }
  mkdirSync(dataFolder, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(path, `${secret}\n`, { mode: 0o600 });
  return { secret, created: true, path };
}
