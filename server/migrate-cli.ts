// `npm run migrate` (and `node build/server/migrate.js` in production): applies every pending
// migration to DATABASE_URL and brings the reference species up to date, then exits; the server
// itself never migrates.
import { loadConfig } from './config';
import { syncReferenceSpecies } from './modules/species/reference-sync';
import { createDb } from './db/database';
import { migrateToLatest } from './db/migrate';

const config = loadConfig();
const db = createDb(config.databaseUrl, 1);
try {
  const { results } = await migrateToLatest(db);
  const applied = results?.filter((r) => r.status === 'Success').map((r) => r.migrationName) ?? [];
  process.stdout.write(
    applied.length
      ? `hilum: applied migrations: ${applied.join(', ')}\n`
      : 'hilum: the database is up to date\n',
  );
  await syncReferenceSpecies(db);
} catch (error) {
  process.stderr.write(`hilum: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
