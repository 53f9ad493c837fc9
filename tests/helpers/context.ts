import crypto from 'node:crypto';
import argon2 from 'argon2';
import type { Express } from 'express';
import { Kysely, PostgresDialect, sql } from 'kysely';
import pg from 'pg';
import { createApp } from '#server/app';
import { verifyPassword, type PasswordHasher } from '#server/auth/password';
import { createTestClock } from '#server/clock';
import { loadConfig, type Config } from '#server/config';
import { startChangeFeed, type ChangeFeed } from '#server/db/change-feed';
import { createDb, type Db } from '#server/db/database';
import { migrateToLatest } from '#server/db/migrate';
import { syncReferenceSpecies } from '#server/modules/species/reference-sync';
import { createMailQueue, type MailQueue } from '#server/mail/mail-queue';
import { createMailer, type Mailer } from '#server/mail/mailer';
import { createObjectStore, type ObjectStore } from '#server/storage/object-store';

export function adminUrl(): string {
  const url = process.env.HILUM_TEST_ADMIN_URL;
  if (!url) throw new Error('HILUM_TEST_ADMIN_URL is not set: run the suite with `npm test`');
  return url;
}

function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

async function admin<T>(run: (db: Kysely<unknown>) => Promise<T>): Promise<T> {
  const db = new Kysely<unknown>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString: adminUrl(), max: 1 }) }),
  });
  try {
    return await run(db);
  } finally {
    await db.destroy();
  }
}

/** A fresh, empty database of its own for one test file; `migrate: false` leaves it bare. */
export async function createTestDatabase(
  options: { migrate?: boolean; onQuery?: (sql: string) => void } = {},
) {
  const name = `hilum_t_${crypto.randomBytes(6).toString('hex')}`;
  await admin((db) => sql`create database ${sql.id(name)}`.execute(db));
  const url = withDatabase(adminUrl(), name);
  const db = createDb(url, 5, options.onQuery);
  if (options.migrate !== false) {
    await migrateToLatest(db);
    await syncReferenceSpecies(db);
  }
  return {
    db,
    url,
    async drop() {
      await db.destroy();
      await admin((a) => sql`drop database if exists ${sql.id(name)} with (force)`.execute(a));
    },
  };
}

export function testConfig(overrides: Partial<Config> = {}): Config {
  return { ...loadConfig(process.env), ...overrides };
}

/**
 * The tests' password hasher: real argon2id at the least cost the library accepts (8 KiB, 1 pass,
 * 1 lane), checked by the app's own verifyPassword. Full strength costs about 2 s a sign-up on this
 * 2-core machine, and the API tests sign up hundreds of people. The production hasher has a test
 * of its own (tests/api/auth.test.ts).
 */
export const cheapTestHasher: PasswordHasher = {
  hash: (password) =>
    argon2.hash(password, { type: argon2.argon2id, memoryCost: 8, timeCost: 1, parallelism: 1 }),
  verify: verifyPassword,
};

/**
 * Sign-ups an hour from one address in API tests: every test signs people up from 127.0.0.1 while
 * the test clock stands still, hundreds in some files. The production limit has tests of its own
 * (tests/api/rate-limits.test.ts).
 */
export const TEST_SIGN_UP_LIMIT = 100_000;

export interface TestContext {
  app: Express;
  db: Db;
  config: Config;
  storage: ObjectStore;
  mailer: Mailer;
  /** Sends right after each request that queues mail; `start` it to also retry (fault tests). */
  mailQueue: MailQueue;
  clock: ReturnType<typeof createTestClock>;
  hasher: PasswordHasher;
  signUpLimit: number;
  /** The app's change feed: `await changeFeed.sync()` after writing in SQL, before reading over HTTP. */
  changeFeed: ChangeFeed;
  close(): Promise<void>;
}

/** The real app on a database of its own, the shared object-store and SMTP fakes, a test clock. */
export async function createTestContext(
  options: {
    now?: string;
    config?: Partial<Config>;
    onQuery?: (sql: string) => void;
    hasher?: PasswordHasher;
    mailRetryDelayMs?: number;
  } = {},
): Promise<TestContext> {
  const database = await createTestDatabase({ onQuery: options.onQuery });
  const config = testConfig({ databaseUrl: database.url, ...options.config });
  const storage = createObjectStore(config.storage);
  const mailer = createMailer(config.mail);
  const clock = createTestClock(options.now ?? '2026-03-01T09:00:00Z');
  const hasher = options.hasher ?? cheapTestHasher;
  const changeFeed = startChangeFeed(config.databaseUrl);
  await changeFeed.ready();
  const mailQueue = createMailQueue({
    db: database.db,
    mailer,
    clock,
    retryDelayMs: options.mailRetryDelayMs,
  });
  const signUpLimit = TEST_SIGN_UP_LIMIT;
  const app = createApp({
    config,
    db: database.db,
    storage,
    mailer,
    mailQueue,
    clock,
    hasher,
    changeFeed,
    signUpLimit,
  });
  return {
    app,
    db: database.db,
    config,
    storage,
    mailer,
    mailQueue,
    clock,
    hasher,
    signUpLimit,
    changeFeed,
    async close() {
      await mailQueue.stop();
      await changeFeed.close();
      storage.close();
      mailer.close();
      await database.drop();
    },
  };
}
