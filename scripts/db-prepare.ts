// Runs the migrations and, on the first run only, seeds the demo season (`--reset-demo` rebuilds
// it). Used by `npm start` and `npm run demo:reset`, with the local services already running.
import { systemClock } from '../server/clock';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/database';
import { createDemoSeason } from '../server/demo/demo-scenario';
import { migrateToLatest } from '../server/db/migrate';
import { DEMO_ACCOUNTS, DEMO_BANK_NAME, isDemoSeeded } from '../server/demo/demo-people';
import { createMailer } from '../server/mail/mailer';
import { refreshStaleResults } from '../server/modules/germination/assay-results';
import { syncReferenceSpecies } from '../server/modules/species/reference-sync';
import { removePhotoObjects } from '../server/photos/store-photo';
import { createObjectStore } from '../server/storage/object-store';

const config = loadConfig();
const db = createDb(config.databaseUrl, 2);
const storage = createObjectStore(config.storage);
const mailer = createMailer(config.mail);
try {
  const { results } = await migrateToLatest(db);
  const applied = results?.filter((r) => r.status === 'Success').map((r) => r.migrationName) ?? [];
  if (applied.length) process.stdout.write(`hilum: applied migrations: ${applied.join(', ')}\n`);
  await syncReferenceSpecies(db);
  // Tests stored before a change to the result's definition (or before results were stored).
  const refreshed = await refreshStaleResults(db);
  if (refreshed)
    process.stdout.write(`hilum: recomputed the stored results of ${refreshed} germination tests\n`);
  const reset = process.argv.includes('--reset-demo');
  if (reset) {
    const banks = await db.selectFrom('banks').select('id').where('name', '=', DEMO_BANK_NAME).execute();
    for (const bank of banks) {
      const keys = await db
        .selectFrom('photos')
        .select(['full_key', 'thumb_key'])
        .where('bank_id', '=', bank.id)
        .execute();
      await removePhotoObjects(
        storage,
        keys.flatMap((k) => [k.full_key, k.thumb_key]),
      );
    }
    await db.transaction().execute(async (trx) => {
      if (banks.length) {
        const ids = banks.map((b) => b.id);
        await trx.deleteFrom('plan_entries').where('bank_id', 'in', ids).execute();
        await trx.deleteFrom('germination_tests').where('bank_id', 'in', ids).execute();
        await trx.deleteFrom('banks').where('id', 'in', ids).execute();
      }
      await trx
        .deleteFrom('users')
        .where('email', 'in', [...DEMO_ACCOUNTS.map((a) => a.email), 'grower2@example.org'])
        .execute();
      await trx.deleteFrom('app_meta').where('key', '=', 'demo_seeded_at').execute();
    });
    process.stdout.write('hilum: removed the demo season\n');
  }
  if (!process.argv.includes('--no-demo') && (reset || !(await isDemoSeeded(db)))) {
    process.stdout.write('hilum: seeding the demo season (accounts, lots, tests, photos, plan)…\n');
    await createDemoSeason({ db, storage, mailer, clock: systemClock, appOrigin: config.appOrigin });
    process.stdout.write('hilum: seeded the demo season\n');
  }
} catch (error) {
  process.stderr.write(`hilum: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
  process.exitCode = 1;
} finally {
  storage.close();
  mailer.close();
  await db.destroy();
}
