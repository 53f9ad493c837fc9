import { sql, type Insertable, type Updateable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { GerminationTestTable, TestTrayTable } from '#server/db/schema';
import type { AssaySummary } from '#server/stats/index';

/** A bank's tests, each with its lot's code, variety and species. */
function assaysWithLot(on: DbOrTx, bankId: string) {
  return on
    .selectFrom('germination_tests')
    .innerJoin('lots', 'lots.id', 'germination_tests.lot_id')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .leftJoin('users as runner', 'runner.id', 'germination_tests.run_by')
    .selectAll('germination_tests')
    .select([
      'lots.code as lot_code',
      'lots.variety',
      'lots.species_id',
      'species.common_name',
      'runner.name as runner_name',
    ])
    .where('germination_tests.bank_id', '=', bankId);
}

/** A member's role in the bank, or undefined for someone who is not a member. */
export function memberRole(on: DbOrTx, bankId: string, userId: string) {
  return on
    .selectFrom('memberships')
    .select('role')
    .where('bank_id', '=', bankId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
}
export type AssayWithLot = Awaited<ReturnType<ReturnType<typeof assaysWithLot>['executeTakeFirstOrThrow']>>;

/** One test of the bank with its lot, locked for update when `lock` is set. */
export function findAssay(on: DbOrTx, bankId: string, assayId: string, lock = false) {
  let q = assaysWithLot(on, bankId).where('germination_tests.id', '=', assayId);
  if (lock) q = q.forUpdate('germination_tests');
  return q.executeTakeFirst();
}

/** Every test of the bank with its lot, by lot code, start date and the order they were logged. */
export function assaysWithLotByCode(on: DbOrTx, bankId: string) {
  return assaysWithLot(on, bankId)
    .orderBy(sql`lower(lots.code)`)
    .orderBy('germination_tests.start_date')
    .orderBy('germination_tests.created_at')
    .orderBy('germination_tests.id')
    .execute();
}

/** The counts of these trays, by date. */
export function countsOfTrays(on: DbOrTx, trayIds: string[]) {
  return on
    .selectFrom('tray_counts')
    .select(['tray_id', 'check_date', 'cumulative'])
    .where('tray_id', 'in', trayIds)
    .orderBy('check_date')
    .execute();
}

/** The rough scores of these trays, by date. */
export function scoresOfTrays(on: DbOrTx, trayIds: string[]) {
  return on
    .selectFrom('tray_scores')
    .select(['tray_id', 'check_date', 'score'])
    .where('tray_id', 'in', trayIds)
    .orderBy('check_date')
    .execute();
}

/** The trays of the tests, by position, their counts and their rough scores, by date. */
export async function traysAndCounts(on: DbOrTx, assayIds: string[]) {
  const trays = assayIds.length
    ? await on
        .selectFrom('test_trays')
        .selectAll()
        .where('test_id', 'in', assayIds)
        .orderBy('position')
        .execute()
    : [];
  const trayIds = trays.map((tr) => tr.id);
  const counts = trays.length ? await countsOfTrays(on, trayIds) : [];
  const scores = trays.length ? await scoresOfTrays(on, trayIds) : [];
  return { trays, counts, scores };
}

/** Whether the lot has any germination test (shared: the lots module asks before deleting a lot). */
export async function lotHasAssays(db: DbOrTx, lotId: string): Promise<boolean> {
  const row = await db
    .selectFrom('germination_tests')
    .select('id')
    .where('lot_id', '=', lotId)
    .limit(1)
    .executeTakeFirst();
  return Boolean(row);
}

/** The seeds the test took from its lot's ledger (none for a test imported as history). */
export async function seedsTakenBy(on: DbOrTx, assayId: string): Promise<number> {
  const row = await on
    .selectFrom('stock_movements')
    .select(sql<number>`coalesce(-sum(change), 0)::int`.as('seeds'))
    .where('test_id', '=', assayId)
    .executeTakeFirstOrThrow();
  return row.seeds;
}

export function insertAssay(on: DbOrTx, values: Insertable<GerminationTestTable>) {
  return on.insertInto('germination_tests').values(values).returning('id').executeTakeFirstOrThrow();
}

/** Many tests in one statement (their ids given, so no order of returned rows is relied on). */
export function insertAssays(on: DbOrTx, values: Insertable<GerminationTestTable>[]) {
  return on.insertInto('germination_tests').values(values).execute();
}

export function insertTray(on: DbOrTx, values: Insertable<TestTrayTable>) {
  return on.insertInto('test_trays').values(values).returning('id').executeTakeFirstOrThrow();
}

export function insertTrays(on: DbOrTx, values: Insertable<TestTrayTable>[]) {
  return on.insertInto('test_trays').values(values).execute();
}

export function insertCounts(
  on: DbOrTx,
  values: { tray_id: string; check_date: string; cumulative: number; created_by: string }[],
) {
  return on.insertInto('tray_counts').values(values).execute();
}

/** The ids of the bank's tests of a lot, newest first. */
/** The lot's assay ids, latest start first; null when the lot is not in the bank. */
export async function assayIdsOfLot(on: DbOrTx, bankId: string, lotId: string): Promise<string[] | null> {
  const rows = await on
    .selectFrom('lots')
    .leftJoin('germination_tests', 'germination_tests.lot_id', 'lots.id')
    .select('germination_tests.id')
    .where('lots.bank_id', '=', bankId)
    .where('lots.id', '=', lotId)
    .orderBy('germination_tests.start_date', 'desc')
    .execute();
  if (rows.length === 0) return null;
  return rows.flatMap((r) => (r.id === null ? [] : [r.id]));
}

export function updateAssay(on: DbOrTx, assayId: string, changes: Updateable<GerminationTestTable>) {
  return on.updateTable('germination_tests').set(changes).where('id', '=', assayId).execute();
}

/** The test's trays, in the order the database gives them. */
export function traysOf(on: DbOrTx, assayId: string) {
  return on.selectFrom('test_trays').selectAll().where('test_id', '=', assayId).execute();
}

/** The test's trays by position. */
export function traysInOrder(on: DbOrTx, assayId: string) {
  return on.selectFrom('test_trays').selectAll().where('test_id', '=', assayId).orderBy('position').execute();
}

export async function trayIdsOf(on: DbOrTx, assayId: string): Promise<string[]> {
  return (await on.selectFrom('test_trays').select('id').where('test_id', '=', assayId).execute()).map(
    (r) => r.id,
  );
}

/** The counts of these trays on every date but `date`, by date. */
export function countsOtherThan(on: DbOrTx, trayIds: string[], date: string) {
  return on
    .selectFrom('tray_counts')
    .select(['tray_id', 'check_date', 'cumulative'])
    .where('tray_id', 'in', trayIds)
    .where('check_date', '<>', date)
    .orderBy('check_date')
    .execute();
}

/** Records a tray's cumulative count on a date, replacing one recorded before. */
export function upsertCount(on: DbOrTx, trayId: string, date: string, cumulative: number, userId: string) {
  return on
    .insertInto('tray_counts')
    .values({ tray_id: trayId, check_date: date, cumulative, created_by: userId })
    .onConflict((oc) => oc.columns(['tray_id', 'check_date']).doUpdateSet({ cumulative, created_by: userId }))
    .execute();
}

/** The rough scores of these trays on every date but `date`, by date. */
export function scoresOtherThan(on: DbOrTx, trayIds: string[], date: string) {
  return on
    .selectFrom('tray_scores')
    .select(['tray_id', 'check_date', 'score'])
    .where('tray_id', 'in', trayIds)
    .where('check_date', '<>', date)
    .orderBy('check_date')
    .execute();
}

/** Records a tray's rough score on a date, replacing one recorded before. */
export function upsertScore(
  on: DbOrTx,
  trayId: string,
  date: string,
  score: 'none' | 'few' | 'half' | 'most',
  userId: string,
) {
  return on
    .insertInto('tray_scores')
    .values({ tray_id: trayId, check_date: date, score, created_by: userId })
    .onConflict((oc) => oc.columns(['tray_id', 'check_date']).doUpdateSet({ score, created_by: userId }))
    .execute();
}

/** Removes the counts and rough scores of a date; the number of rows removed. */
export async function deleteCountsOn(on: DbOrTx, trayIds: string[], date: string): Promise<number> {
  const counts = await on
    .deleteFrom('tray_counts')
    .where('tray_id', 'in', trayIds)
    .where('check_date', '=', date)
    .executeTakeFirst();
  const scores = await on
    .deleteFrom('tray_scores')
    .where('tray_id', 'in', trayIds)
    .where('check_date', '=', date)
    .executeTakeFirst();
  return Number(counts.numDeletedRows) + Number(scores.numDeletedRows);
}

export function updateTray(on: DbOrTx, trayId: string, changes: Updateable<TestTrayTable>) {
  return on.updateTable('test_trays').set(changes).where('id', '=', trayId).execute();
}

/** Sets a tray of the test aside (or back); the result says whether the tray was found. */
export function setTrayAsideReason(on: DbOrTx, assayId: string, trayId: string, reason: string | null) {
  return on
    .updateTable('test_trays')
    .set({ set_aside_reason: reason })
    .where('id', '=', trayId)
    .where('test_id', '=', assayId)
    .executeTakeFirst();
}

export function deleteAssay(on: DbOrTx, assayId: string) {
  return on.deleteFrom('germination_tests').where('id', '=', assayId).execute();
}

/** The bank's lots by id, code and species, for the CSV import. */
export function lotsForImport(on: DbOrTx, bankId: string) {
  return on
    .selectFrom('lots')
    .innerJoin('species', 'species.id', 'lots.species_id')
    .select(['lots.id', 'lots.code', 'lots.variety', 'lots.harvest_date', 'species.common_name'])
    .where('lots.bank_id', '=', bankId)
    .execute();
}

// The stored result (assay-results.ts): its reads and its one batched write.

export function assayStartDates(on: DbOrTx, assayIds: string[]) {
  return on
    .selectFrom('germination_tests')
    .select(['id', 'start_date'])
    .where('id', 'in', assayIds)
    .execute();
}

/** The trays of the tests, by test and position. */
export function traysOfAssays(on: DbOrTx, assayIds: string[]) {
  return on
    .selectFrom('test_trays')
    .selectAll()
    .where('test_id', 'in', assayIds)
    .orderBy('test_id')
    .orderBy('position')
    .execute();
}

/** The last check date (count or rough score) of each test's trays that enter the figures (set-aside trays left out). */
export function lastCountRows(on: DbOrTx, assayIds: string[]) {
  const checks = on
    .selectFrom('tray_counts')
    .select(['tray_id', 'check_date'])
    .unionAll(on.selectFrom('tray_scores').select(['tray_id', 'check_date']));
  return on
    .selectFrom(checks.as('c'))
    .innerJoin('test_trays', 'test_trays.id', 'c.tray_id')
    .select(['test_trays.test_id', sql<string>`max(c.check_date)`.as('last')])
    .where('test_trays.test_id', 'in', assayIds)
    .where('test_trays.set_aside_reason', 'is', null)
    .groupBy('test_trays.test_id')
    .execute();
}

/** Writes the results of a batch of tests in one statement, stamped with `version`. */
export async function writeResults(
  on: DbOrTx,
  rows: { testId: string; r: AssaySummary }[],
  last: Map<string, string>,
  version: number,
) {
  await sql`
    update germination_tests g set
      result = v.result::jsonb,
      result_version = ${version},
      result_sown = v.sown,
      result_germinated = v.germinated,
      result_percent = v.percent,
      result_mean_days = v.mean_days,
      result_last_count_date = v.last_count
    from (
      select unnest(${rows.map((x) => x.testId)}::uuid[]) as id,
        unnest(${rows.map((x) => JSON.stringify(x.r))}::text[]) as result,
        unnest(${rows.map((x) => x.r.sown)}::float8[]) as sown,
        unnest(${rows.map((x) => x.r.germinated)}::int[]) as germinated,
        unnest(${rows.map((x) => x.r.percent)}::float8[]) as percent,
        unnest(${rows.map((x) => x.r.meanDays)}::float8[]) as mean_days,
        unnest(${rows.map((x) => last.get(x.testId) ?? null)}::date[]) as last_count
    ) v
    where g.id = v.id`.execute(on);
}

/** Up to `limit` tests stored under a definition older than `version`, by id. */
export function staleAssayIds(on: DbOrTx, version: number, limit: number) {
  return on
    .selectFrom('germination_tests')
    .select('id')
    .where('result_version', '<', version)
    .orderBy('id')
    .limit(limit)
    .execute();
}
