import { spawnSync } from 'node:child_process';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrateAllDown, migrateToLatest } from '#server/db/migrate';
import { createTestDatabase } from '../helpers/context';

async function tableNames(db: Parameters<typeof migrateToLatest>[0]): Promise<string[]> {
  const { rows } = await sql<{ table_name: string }>`
    select table_name from information_schema.tables
    where table_schema = 'public' and table_name not like 'kysely_%' order by table_name`.execute(db);
  return rows.map((r) => r.table_name);
}

describe('migrations', () => {
  let database: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    database = await createTestDatabase({ migrate: false });
  });
  afterAll(() => database.drop());

  it('when run up on an empty database, then every table exists', async () => {
    await migrateToLatest(database.db);
    expect(await tableNames(database.db)).toEqual(
      expect.arrayContaining(['app_meta', 'banks', 'memberships', 'sessions', 'users']),
    );
  });

  it('when run all the way down, then no application table is left, and up again works', async () => {
    await migrateAllDown(database.db);
    expect(await tableNames(database.db)).toEqual([]);
    await migrateToLatest(database.db);
    expect((await tableNames(database.db)).length).toBeGreaterThanOrEqual(5);
  });

  it('when run up twice, then the second run applies nothing', async () => {
    const { results } = await migrateToLatest(database.db);
    expect(results).toEqual([]);
  });
});

describe('npm run migrate', () => {
  let database: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    database = await createTestDatabase({ migrate: false });
  });
  afterAll(() => database.drop());
  const migrate = () =>
    spawnSync(process.execPath, ['--import', 'tsx', 'server/db/migrate-cli.ts'], {
      env: { ...process.env, DATABASE_URL: database.url },
      encoding: 'utf8',
    });

  it('when run on an empty database, then it migrates it and says so, and a second run says it is current', async () => {
    const first = migrate();
    expect(first.status, first.stderr).toBe(0);
    expect(first.stdout).toMatch(/^migrated: 2026_12_01_000000_accounts_and_banks, /);
    expect(await tableNames(database.db)).toEqual(expect.arrayContaining(['banks', 'lots', 'sessions']));
    const second = migrate();
    expect(second.status, second.stderr).toBe(0);
    expect(second.stdout).toBe('the database is up to date\n');
  });
});

describe('the migration index', () => {
  it('when a migration file exists in migrations/, then it is listed in migrations/index.ts', async () => {
    const fs = await import('node:fs');
    const path = await import('node:path');
    const { migrations } = await import('#migrations/index');
    const dir = path.resolve(import.meta.dirname, '..', '..', 'migrations');
    const files = fs
      .readdirSync(dir)
      .filter((f) => /^\d{4}_\d{2}_\d{2}_\d{6}_.+\.ts$/.test(f))
      .map((f) => f.replace(/\.ts$/, ''));
    expect(Object.keys(migrations).sort()).toEqual(files.sort());
  });
});
