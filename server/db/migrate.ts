import { Migrator, type Kysely, type MigrationResultSet } from 'kysely';
import { migrations } from '#migrations/index';

// Kysely's migrations take Kysely<any> on purpose: they are frozen in time and never import the
// app's current Database type.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyDb = Kysely<any>;

export function createMigrator(db: AnyDb): Migrator {
  // Engineers working in parallel number a day's migrations at random so none depends on another's
  // order; a database that already ran a later-numbered one must still take an earlier newcomer.
  return new Migrator({
    db,
    provider: { getMigrations: async () => migrations },
    allowUnorderedMigrations: true,
  });
}

function check({ error, results }: MigrationResultSet): MigrationResultSet {
  if (error) {
    const failed = results?.find((r) => r.status === 'Error');
    const where = failed ? ` in ${failed.migrationName}` : '';
    throw new Error(`migration failed${where}: ${error instanceof Error ? error.message : String(error)}`);
  }
  return { results };
}

export async function migrateToLatest(db: AnyDb): Promise<MigrationResultSet> {
  return check(await createMigrator(db).migrateToLatest());
}

/** Reverts every migration, newest first. */
export async function migrateAllDown(db: AnyDb): Promise<void> {
  const migrator = createMigrator(db);
  for (;;) {
    const outcome = check(await migrator.migrateDown());
    if (!outcome.results || outcome.results.length === 0) return;
  }
}
