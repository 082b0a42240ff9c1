import express, { type Express } from 'express';
import type { Clock } from './clock';
import type { AppConfig } from './config';
import type { Db } from './db/client';
import type { AppDeps } from './deps';
import type { Outbox } from './email/capture-server';
import type { Mailer } from './email/mailer';
import { NotFound } from './errors';
import { createLogger, type Logger } from './logger';
import { serveClient } from './middleware/client';
import { csrfProtection } from './middleware/csrf';
import { errorHandler } from './middleware/error-handler';
import { createLimiters } from './middleware/rate-limit';
import { readCacheInvalidation } from './middleware/read-cache';
import { requestLogger } from './middleware/request-logger';
import { securityHeaders } from './middleware/security-headers';
import { createSessionMiddleware } from './middleware/session';
import { mountRoutes } from './routes/define-route';
import { apiRoutes } from './routes';
import { createAssessmentEngine, type AssessmentEngine } from './services/assessment';

export interface CreateAppOptions {
  db: Db;
  mailer: Mailer;
  config: AppConfig;
  clock: Clock;
  logger?: Logger;
  outbox?: Outbox;
  /** Statistics threads and cache; by default the app makes its own and stops it in dispose(). */
  assessmentEngine?: AssessmentEngine;
}

/** The Express app plus `dispose()`, which stops the session store's clean-up timer. */
export type BellwetherApp = Express & { dispose(): void };

/**
 * Builds the whole web app from its dependencies, without listening: server.ts listens, tests
 * call it through supertest. Order: request log → security headers → /api (JSON body, session,
 * CSRF, routes from the inventory, JSON 404) → built client with history fallback → errors.
 */
export function createApp(options: CreateAppOptions): BellwetherApp {
  const { config } = options;
  const logger = options.logger ?? createLogger(config.logLevel);
  const assessment =
    options.assessmentEngine ??
    createAssessmentEngine({ onFallback: (reason) => logger.warn({ reason }, 'statistics worker threads cannot start; computing in the main thread') });
  // A running server loads its statistics threads at once, so the first assessment does not wait for them.
  if (!options.assessmentEngine && config.nodeEnv !== 'test') assessment.pool.warm();
  const deps: AppDeps = { ...options, logger, assessment };
  const app = express() as BellwetherApp;
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);

  app.use(requestLogger(deps.logger));
  app.use(securityHeaders(config.nodeEnv === 'production'));

  const sessions = createSessionMiddleware(deps.db, config);
  const api = express.Router();
  api.use(express.json({ limit: config.jsonLimit }));
  api.use(sessions.middleware);
  api.use((_req, res, next) => {
    // API answers are per-user: never let a shared cache keep them.
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(csrfProtection);
  // Cached answers of the heavy read endpoints are dropped after every request that may write.
  api.use(readCacheInvalidation(deps.db));
  mountRoutes(api, apiRoutes, deps, createLimiters(config.rateLimits));
  api.use((req, _res, next) => next(new NotFound(`No API endpoint ${req.method} ${req.originalUrl.split('?')[0]}`)));
  app.use('/api', api);

  serveClient(app, config.clientDir);
  app.use(errorHandler(deps.logger, config.jsonLimit));

  app.dispose = () => {
    sessions.close();
    if (!options.assessmentEngine) void assessment.close();
  };
  return app;
}
