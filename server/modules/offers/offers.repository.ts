import { sql, type Insertable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { LotOfferTable, ReceivedTestTable } from '#server/db/schema';

const num = (v: string | null) => (v === null ? null : Number(v));

/** The caller's role in a bank, or undefined when not a member. */
export const roleIn = async (db: DbOrTx, bankId: string, userId: string) =>
  (
    await db
      .selectFrom('memberships')
      .select('role')
      .where('bank_id', '=', bankId)
      .where('user_id', '=', userId)
      .executeTakeFirst()
  )?.role;

/** The banks the person belongs to, with their role and name. */
export const banksOf = (db: DbOrTx, userId: string) =>
  db
    .selectFrom('memberships')
    .innerJoin('banks', 'banks.id', 'memberships.bank_id')
    .select(['banks.id', 'banks.name', 'memberships.role'])
    .where('memberships.user_id', '=', userId)
    .execute();

/** What an offer is made from: the lot in the bank, with whether its species is the bank's own. */
export const lotToOffer = (db: DbOrTx, bankId: string, lotId: string) =>
  db
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select(['lots.id', 'lots.code', 'lots.status', 'species.bank_id as species_bank_id'])
    .where('lots.id', '=', lotId)
    .where('lots.bank_id', '=', bankId)
    .executeTakeFirst();

export const insertOffer = (db: DbOrTx, values: Insertable<LotOfferTable>) =>
  db.insertInto('lot_offers').values(values).returning('id').executeTakeFirstOrThrow();

/** An offer with its lot and both banks, as accepting, declining and previewing read it. */
function offerQuery(db: DbOrTx) {
  return db
    .selectFrom('lot_offers as o')
    .innerJoin('lots as l', 'l.id', 'o.lot_id')
    .innerJoin('species as s', 's.id', 'l.species_id')
    .innerJoin('banks as fb', 'fb.id', 'o.from_bank_id')
    .leftJoin('banks as tb', 'tb.id', 'o.to_bank_id')
    .select([
      'o.id',
      'o.from_bank_id',
      'o.lot_id',
      'o.seeds',
      'o.to_bank_id',
      'o.token_hash',
      'o.expires_at',
      'o.show_bank_name',
      'o.status',
      'o.created_by',
      'l.code as lot_code',
      'l.species_id',
      's.common_name as species_name',
      's.scientific_name',
      'l.variety',
      'l.harvest_date',
      'l.packed_for_season',
      'l.plants_bulked',
      'l.treated',
      'l.amount_kind',
      'fb.name as from_bank_name',
      'tb.name as to_bank_name',
    ]);
}
export type OfferRow = Awaited<ReturnType<ReturnType<typeof offerQuery>['executeTakeFirstOrThrow']>>;

export const findOffer = (db: DbOrTx, offerId: string) =>
  offerQuery(db).where('o.id', '=', offerId).executeTakeFirst();

/** The offer, locked until the transaction ends (two accepts of one offer wait for each other). */
export const lockOffer = (db: DbOrTx, offerId: string) =>
  offerQuery(db).where('o.id', '=', offerId).forUpdate('o').executeTakeFirst();

/** The giver's finished tests of the lot that were not set aside, with their stored results. */
export const finishedTestsOf = (db: DbOrTx, lotId: string) =>
  db
    .selectFrom('germination_tests')
    .select([
      'start_date',
      'finished_on',
      'method',
      'medium',
      'temperature_c',
      'light_hours',
      'pretreatment',
      'result',
      'result_sown',
      'result_germinated',
      'result_percent',
      'result_mean_days',
      'result_last_count_date',
      sql<number>`(select count(*)::int from test_trays tt where tt.test_id = germination_tests.id)`.as(
        'trays',
      ),
    ])
    .where('lot_id', '=', lotId)
    .where('status', '=', 'finished')
    .where('set_aside_reason', 'is', null)
    .where('result', 'is not', null)
    .orderBy('start_date')
    .orderBy('created_at')
    .execute();
export type GiverTestRow = Awaited<ReturnType<typeof finishedTestsOf>>[number];

export const insertReceivedTests = (db: DbOrTx, rows: Insertable<ReceivedTestTable>[]) =>
  rows.length ? db.insertInto('received_tests').values(rows).execute() : Promise.resolve([]);

export const markAccepted = (
  db: DbOrTx,
  offerId: string,
  values: { bankId: string; lotId: string; userId: string; now: Date },
) =>
  db
    .updateTable('lot_offers')
    .set({
      status: 'accepted',
      decided_at: values.now,
      accepted_bank_id: values.bankId,
      accepted_lot_id: values.lotId,
      accepted_by: values.userId,
    })
    .where('id', '=', offerId)
    .execute();

/** Closes an open offer; the result says whether it was open. */
export const closeOpen = (db: DbOrTx, offerId: string, status: 'declined' | 'withdrawn', now: Date) =>
  db
    .updateTable('lot_offers')
    .set({ status, decided_at: now })
    .where('id', '=', offerId)
    .where('status', '=', 'open')
    .executeTakeFirst();

/** The lot's offers, newest first, with the banks they go to and who asked for them. */
export async function offersOfLot(db: DbOrTx, bankId: string, lotId: string) {
  const offers = await db
    .selectFrom('lot_offers as o')
    .leftJoin('banks as tb', 'tb.id', 'o.to_bank_id')
    .select([
      'o.id',
      'o.seeds',
      'o.status',
      'o.to_bank_id',
      'tb.name as to_bank_name',
      'o.token_hash',
      'o.show_bank_name',
      'o.created_at',
      'o.expires_at',
    ])
    .where('o.from_bank_id', '=', bankId)
    .where('o.lot_id', '=', lotId)
    .orderBy('o.created_at', 'desc')
    .execute();
  const requests = offers.length
    ? await db
        .selectFrom('offer_requests as r')
        .innerJoin('users as u', 'u.id', 'r.user_id')
        .select(['r.id', 'r.offer_id', 'u.name', 'r.note', 'r.created_at'])
        .where(
          'r.offer_id',
          'in',
          offers.map((o) => o.id),
        )
        .orderBy('r.created_at')
        .execute()
    : [];
  return { offers, requests };
}

/** Open offers from or to the banks the person belongs to, with the lot and who offered it. */
export const circleOffers = (db: DbOrTx, userId: string, now: Date) =>
  db
    .selectFrom('lot_offers as o')
    .innerJoin('lots as l', 'l.id', 'o.lot_id')
    .innerJoin('species as s', 's.id', 'l.species_id')
    .innerJoin('banks as fb', 'fb.id', 'o.from_bank_id')
    .leftJoin('banks as tb', 'tb.id', 'o.to_bank_id')
    .leftJoin('users as u', 'u.id', 'o.created_by')
    .select([
      'o.id',
      'o.seeds',
      'o.from_bank_id',
      'fb.name as from_bank_name',
      'o.to_bank_id',
      'tb.name as to_bank_name',
      'o.token_hash',
      'o.lot_id',
      'l.code as lot_code',
      's.common_name as species_name',
      'l.variety',
      'l.treated',
      'u.name as offered_by',
      'o.created_at',
      sql<number>`(select count(*)::int from offer_requests r where r.offer_id = o.id)`.as('requests'),
      sql<boolean>`exists (select 1 from offer_requests r where r.offer_id = o.id and r.user_id = ${userId})`.as(
        'asked_by_me',
      ),
    ])
    .where('o.status', '=', 'open')
    .where((eb) => eb.or([eb('o.expires_at', 'is', null), eb('o.expires_at', '>', now)]))
    .where((eb) =>
      eb.or([
        eb(
          'o.from_bank_id',
          'in',
          eb.selectFrom('memberships').select('bank_id').where('user_id', '=', userId),
        ),
        eb(
          'o.to_bank_id',
          'in',
          eb.selectFrom('memberships').select('bank_id').where('user_id', '=', userId),
        ),
      ]),
    )
    .orderBy('o.created_at', 'desc')
    .execute();

/** How the lot came to the bank by an accepted offer, if it did, with the giver's tests. */
export async function receivedOf(db: DbOrTx, bankId: string, lotId: string) {
  const offer = await db
    .selectFrom('lot_offers as o')
    .innerJoin('lots as l', 'l.id', 'o.lot_id')
    .innerJoin('banks as fb', 'fb.id', 'o.from_bank_id')
    .select(['o.id', 'o.seeds', 'o.show_bank_name', 'o.decided_at', 'l.code', 'fb.name as bank_name'])
    .where('o.accepted_bank_id', '=', bankId)
    .where('o.accepted_lot_id', '=', lotId)
    .executeTakeFirst();
  if (!offer) return null;
  const tests = await db
    .selectFrom('received_tests')
    .selectAll()
    .where('bank_id', '=', bankId)
    .where('lot_id', '=', lotId)
    .orderBy('start_date')
    .execute();
  return { offer, tests };
}

export const toReceivedTestDto = (t: {
  id: string;
  start_date: string;
  finished_on: string | null;
  method: string;
  medium: string | null;
  temperature_c: string | null;
  light_hours: string | null;
  pretreatment: ReceivedTestTable['pretreatment'];
  trays: number;
  result: unknown;
  result_sown: number | null;
  result_germinated: number | null;
  result_percent: number | null;
  result_mean_days: number | null;
}) => {
  const interval = (t.result as { interval?: { low: number; high: number } | null }).interval ?? null;
  return {
    id: t.id,
    startDate: t.start_date,
    finishedOn: t.finished_on,
    method: t.method,
    medium: t.medium,
    temperatureC: num(t.temperature_c),
    lightHours: num(t.light_hours),
    pretreatment: t.pretreatment,
    trays: t.trays,
    sown: t.result_sown,
    germinated: t.result_germinated,
    percent: t.result_percent,
    interval: interval ? { low: interval.low, high: interval.high } : null,
    meanDays: t.result_mean_days,
  };
};

export const insertRequest = (
  db: DbOrTx,
  values: { offer_id: string; user_id: string; note: string | null },
) =>
  db
    .insertInto('offer_requests')
    .values(values)
    .onConflict((oc) => oc.columns(['offer_id', 'user_id']).doNothing())
    .returning('id')
    .executeTakeFirst();

export const setRequestMail = (db: DbOrTx, requestId: string, mailId: string) =>
  db.updateTable('offer_requests').set({ mail_id: mailId }).where('id', '=', requestId).execute();

export const userContact = (db: DbOrTx, userId: string) =>
  db.selectFrom('users').select(['name', 'email']).where('id', '=', userId).executeTakeFirst();
