// Runs the migrations and, on the first run only, seeds the demo bank. Used by `npm start`.
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrate';
import { seedDemo } from '../server/db/seed-demo';
import { syncReferenceSpecies } from '../server/modules/species/reference-sync';

const config = loadConfig();
const db = createDb(config.databaseUrl, 2);
try {
  const { results } = await migrateToLatest(db);
  const applied = results?.filter((r) => r.status === 'Success').map((r) => r.migrationName) ?? [];
  if (applied.length) process.stdout.write(`hilum: applied migrations: ${applied.join(', ')}\n`);
  await syncReferenceSpecies(db);
  if (!process.argv.includes('--no-demo') && (await seedDemo(db))) {
    process.stdout.write('hilum: seeded the demo bank\n');
  }
} catch (error) {
  process.stderr.write(`hilum: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
