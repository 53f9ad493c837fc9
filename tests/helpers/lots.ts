import type { Agent } from 'supertest';
import type { Db } from '#server/db/database';
import { DAY_MS } from '#shared/dates';

/** The id of a reference species by its key in shared/species-reference.ts. */
export async function speciesId(db: Db, key: string): Promise<string> {
  const row = await db
    .selectFrom('species')
    .select('id')
    .where('ref_key', '=', key)
    .executeTakeFirstOrThrow();
  return row.id;
}

/**
 * Records a finished germination test through the API: trays sown, one count on `countDate`
 * (default the start date plus 14 days), then finished with the rest ungerminated.
 */
export async function finishedAssay(
  agent: Agent,
  bankId: string,
  lotId: string,
  startDate: string,
  trays: { sown: number; germinated: number }[],
  countDate = new Date(Date.parse(startDate) + 14 * DAY_MS).toISOString().slice(0, 10),
) {
  const created = await agent
    .post(`/api/banks/${bankId}/lots/${lotId}/tests`)
    .send({ startDate, method: 'paper towel', trays: trays.map((t) => ({ seedsSown: t.sown })) });
  if (created.status !== 201) throw new Error(`test not created: ${JSON.stringify(created.body)}`);
  const ids: string[] = created.body.trays.map((t: { id: string }) => t.id);
  const assayId: string = created.body.test.id;
  const counted = await agent
    .post(`/api/banks/${bankId}/tests/${assayId}/counts`)
    .send({ date: countDate, trays: ids.map((trayId, i) => ({ trayId, cumulative: trays[i]!.germinated })) });
  if (counted.status !== 201) throw new Error(`counts refused: ${JSON.stringify(counted.body)}`);
  const finished = await agent.post(`/api/banks/${bankId}/tests/${assayId}/finish`).send({
    date: countDate,
    trays: ids.map((trayId, i) => ({
      trayId,
      abnormal: 0,
      ungerminated: trays[i]!.sown - trays[i]!.germinated,
    })),
  });
  if (finished.status !== 200) throw new Error(`finish refused: ${JSON.stringify(finished.body)}`);
  return assayId;
}

/**
 * Starts a running germination test through the API (paper towel, 24 °C), one tray per entry of
 * `seedsSown`; returns the test's id and its trays' ids in tray order.
 */
export async function startedAssay(
  agent: Agent,
  bankId: string,
  lotId: string,
  startDate: string,
  seedsSown: number[],
) {
  const created = await agent.post(`/api/banks/${bankId}/lots/${lotId}/tests`).send({
    startDate,
    method: 'paper towel',
    temperatureC: 24,
    trays: seedsSown.map((n) => ({ seedsSown: n })),
  });
  if (created.status !== 201) throw new Error(`test not created: ${JSON.stringify(created.body)}`);
  return {
    testId: created.body.test.id as string,
    trayIds: (created.body.trays as { id: string }[]).map((t) => t.id),
  };
}

/**
 * Logs a saved tomato lot of `seedCount` seeds (harvested 1 Sep 2025) through the API and records a
 * finished two-tray test on `testDate`: 46 and 45 of 50 (91%). Returns the lot's id and code.
 */
export async function testedTomatoLot(
  agent: Agent,
  db: Db,
  bankId: string,
  { variety, seedCount, testDate }: { variety: string; seedCount: number; testDate: string },
) {
  const lot = await agent.post(`/api/banks/${bankId}/lots`).send({
    speciesId: await speciesId(db, 'tomato'),
    variety,
    origin: 'saved',
    harvestDate: '2025-09-01',
    seedCount,
  });
  if (lot.status !== 201) throw new Error(`lot not created: ${JSON.stringify(lot.body)}`);
  await finishedAssay(agent, bankId, lot.body.lot.id, testDate, [
    { sown: 50, germinated: 46 },
    { sown: 50, germinated: 45 },
  ]);
  return { lotId: lot.body.lot.id as string, lotCode: lot.body.lot.code as string };
}
