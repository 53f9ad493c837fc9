import { Router } from 'express';
import type { AppDeps } from '#server/app';
import { healthOf } from './health.service';

export function healthRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const health = await healthOf(deps);
    res.status(health.ok ? 200 : 503).json(health);
  });
  return router;
}
