import { argon2idHasher, type PasswordHasher } from '../auth/password';
import type { Db } from '../db/database';
import type { Role } from '../db/schema';

// Everything here is an invented scenario for the demo: no real people, places or data.
export const DEMO_PASSWORD = 'hilum-demo-seeds';
export const DEMO_BANK_NAME = 'Larkspur Hollow Seed Circle';
/** The demo bank's time zone (an IANA name; the town itself is invented). */
export const DEMO_TIME_ZONE = 'Europe/Helsinki';
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: 'keeper@example.org', name: 'Wren Okafor-Lind', role: 'owner' },
  { email: 'grower@example.org', name: 'Tamsin Reyes', role: 'grower' },
  { email: 'viewer@example.org', name: 'Ilse Marr', role: 'viewer' },
];

const MARKER = 'demo_seeded_at';

export async function isDemoSeeded(db: Db): Promise<boolean> {
  const row = await db.selectFrom('app_meta').select('key').where('key', '=', MARKER).executeTakeFirst();
  return Boolean(row);
}

/**
 * Seeds the demo bank and its members in one transaction; a second call does nothing. Their
 * password is hashed at full strength unless a hasher is given (browser tests pass the cheap one).
 */
export async function addDemoPeople(db: Db, hasher: PasswordHasher = argon2idHasher): Promise<boolean> {
  if (await isDemoSeeded(db)) return false;
  const passwordHash = await hasher.hash(DEMO_PASSWORD);
  await db.transaction().execute(async (trx) => {
    const bank = await trx
      .insertInto('banks')
      .values({
        name: DEMO_BANK_NAME,
        last_frost: '05-24',
        first_frost: '09-18',
        frost_margin_days: 10,
        // A real IANA zone with a short growing season, so "today" and the members' reminder hours
        // are the bank's own wall clock rather than UTC's.
        time_zone: DEMO_TIME_ZONE,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    for (const account of DEMO_ACCOUNTS) {
      const user = await trx
        .insertInto('users')
        .values({
          email: account.email,
          name: account.name,
          password_hash: passwordHash,
          // The demo people count as having confirmed their (invented) addresses.
          email_verified_at: new Date(),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('memberships')
        .values({ bank_id: bank.id, user_id: user.id, role: account.role })
        .execute();
    }
    await trx
      .insertInto('app_meta')
      .values({ key: MARKER, value: JSON.stringify(new Date().toISOString()) })
      .execute();
  });
  return true;
}
