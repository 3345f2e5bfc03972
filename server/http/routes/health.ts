import { checkHealth } from '../../services/health/check-health';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';

export const healthRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/health',
    access: 'public',
    summary: 'Whether the database and the queues answer',
    handle: async ({ res }) => {
      const health = await checkHealth(deps.db, deps.queues);
      res.status(health.database.status === 'ok' ? 200 : 503).json(health);
    },
  }),
];
