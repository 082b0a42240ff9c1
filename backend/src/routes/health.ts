import { databaseHealth } from '../db/client';
import { publicRoute } from './define-route';

export const healthRoutes = [
  publicRoute({
    method: 'get',
    path: '/health',
    summary: 'Liveness and database check: a real query and the applied migrations; 503 with the reason when the database cannot answer',
    handler: ({ res, deps }) => {
      const health = databaseHealth(deps.db);
      res.status(health.ok ? 200 : 503).json(health.ok ? { ok: true, database: { migrations: health.migrations } } : { ok: false, reason: health.reason });
    },
  }),
];
