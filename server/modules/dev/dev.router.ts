import { Router } from 'express';
import { readOutbox } from '#server/mail/outbox';

/** Development-only routes; never mounted in production. */
export function devRouter(outboxDir: string): Router {
  const router = Router();
  router.get('/outbox', async (_req, res) => {
    res.json({ items: await readOutbox(outboxDir) });
  });
  return router;
}
