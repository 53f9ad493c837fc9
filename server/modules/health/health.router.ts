import { Router } from 'express';
import { sql } from 'kysely';
import type { AppDeps } from '../../app';

async function databaseUp(deps: AppDeps): Promise<boolean> {
  try {
    await Promise.race([
      sql`select 1`.execute(deps.db),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2_000)),
    ]);
    return true;
  } catch {
    return false;
  }
}

export function healthRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    const [database, objectStore, mail] = await Promise.all([
      databaseUp(deps),
      deps.storage.ping(),
      deps.mailer.ping(),
    ]);
    const ok = database && objectStore && mail;
    const state = (up: boolean) => (up ? 'up' : 'down');
    res.status(ok ? 200 : 503).json({
      ok,
      database: state(database),
      objectStore: state(objectStore),
      mail: state(mail),
      environment: deps.config.env,
    });
  });
  return router;
}
