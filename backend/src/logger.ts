import { pino, type Logger } from 'pino';

export type { Logger };

/**
 * The server's JSON logger. Level from LOG_LEVEL; tests default to 'silent' so runs stay quiet
 * (pass LOG_LEVEL=debug to see the request log while debugging a test).
 */
export function createLogger(level: string): Logger {
  return pino({ level, base: undefined, redact: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'res.headers["set-cookie"]'] });
}
