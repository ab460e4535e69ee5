import { Router } from 'express';
import type { AppDeps } from './deps';

export function healthRouter(deps: AppDeps) {
  const router = Router();
  router.get('/health', async (_req, res) => {
    try {
      await deps.sequelize.query('SELECT 1');
      res.json({ ok: true, db: 'up' });
    } catch {
      res.status(503).json({ ok: false, db: 'down' });
    }
  });
  return router;
}
