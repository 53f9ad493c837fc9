import type { AppDeps } from '#server/app';
import { selectOne } from './health.repository';

async function databaseUp(deps: AppDeps): Promise<boolean> {
  try {
    await Promise.race([
      selectOne(deps.db),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2_000)),
    ]);
    return true;
  } catch {
    return false;
  }
}

/** Whether the database, the object store and the mail server answer. */
export async function healthOf(deps: AppDeps) {
  const [database, objectStore, mail] = await Promise.all([
    databaseUp(deps),
    deps.storage.ping(),
    deps.mailer.ping(),
  ]);
  const ok = database && objectStore && mail;
  const state = (up: boolean) => (up ? 'up' : 'down');
  return {
    ok,
    database: state(database),
    objectStore: state(objectStore),
    mail: state(mail),
    environment: deps.config.env,
  };
}
