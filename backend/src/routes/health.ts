import { databaseIsHealthy } from '../db/client';
import { publicRoute } from './define-route';

export const healthRoutes = [
  publicRoute({
    method: 'get',
    path: '/health',
    summary: 'Liveness and database check',
    handler: ({ res, deps }) => {
      const ok = databaseIsHealthy(deps.db);
      res.status(ok ? 200 : 503).json({ ok });
    },
  }),
];
