// `npm run migrate`: brings the database named by DATABASE_URL to the latest migration and says
// which ran. (`npm start` and every test database do this by themselves; this is for operators,
// e.g. before starting several servers on one database.)
import { loadConfig } from '#server/config';
import { createDb } from './database';
import { migrateToLatest } from './migrate';

const db = createDb(loadConfig().databaseUrl, 1);
try {
  const { results } = await migrateToLatest(db);
  const ran = (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
  process.stdout.write(ran.length ? `migrated: ${ran.join(', ')}\n` : 'the database is up to date\n');
} catch (error) {
  process.stderr.write(`hilum: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
