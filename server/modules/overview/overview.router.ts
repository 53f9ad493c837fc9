import { Router } from 'express';
import { sql } from 'kysely';
import { z } from 'zod';
import { addDays, daysBetween } from '../../../shared/plan-dates';
import { isoDateSchema } from '../../../shared/schemas/common';
import { overviewSchema } from '../../../shared/schemas/overview';
import { requireRole } from '../../auth/bank-access';
import { bankToday, type Clock } from '../../clock';
import type { Db } from '../../db/database';
import { parse } from '../../http/errors';
import { respond } from '../../http/respond';
import { checkDays } from '../../jobs/reminders';
import { listSpecies } from '../species/species.service';
import type { ViabilityService } from '../viability/viability.service';

/** Fewer seeds than this on hand counts as low stock, when no plan says how many are needed. */
const LOW_STOCK = 20;

/** GET /api/banks/:bankId/overview — what needs doing this week. */
export function overviewRoutes(deps: { db: Db; clock: Clock; viability: ViabilityService }): Router {
  const { db } = deps;
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('viewer'), async (req, res) => {
    const bankId = req.bank!.id;
    const today = parse(z.object({ on: isoDateSchema.optional() }), req.query, 'query').on ?? (await bankToday(db, deps.clock, bankId));
    const weekEnd = addDays(today, 6);
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));

    const running = await db
      .selectFrom('germination_tests')
      .innerJoin('lots', 'lots.id', 'germination_tests.lot_id')
      .select(['germination_tests.id', 'germination_tests.start_date', 'lots.id as lot_id', 'lots.code', 'lots.species_id', 'germination_tests.result_last_count_date as last_count'])
      .select(sql<number | null>`(germination_tests.result->>'percentRounded')::int`.as('percent_so_far'))
      // Trays still to count: a set-aside tray is not counted any more.
      .select((eb) =>
        eb
          .selectFrom('test_trays')
          .select(eb.fn.countAll<number>().as('n'))
          .whereRef('test_trays.test_id', '=', 'germination_tests.id')
          .where('test_trays.set_aside_reason', 'is', null)
          .as('trays'),
      )
      .where('germination_tests.bank_id', '=', bankId)
      .where('germination_tests.status', '=', 'running')
      .execute();
    const traysToCount = running.flatMap((t) => {
      const sp = species.get(t.species_id);
      const days = checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null);
      const lastCount = t.last_count;
      // The next check day not yet counted; an earlier uncounted one is overdue.
      const next = days.map((d) => ({ d, date: addDays(t.start_date, d) })).find((c) => !lastCount || c.date > lastCount);
      if (!next || next.date > weekEnd) return [];
      return [{ testId: t.id, lotId: t.lot_id, lotCode: t.code, species: sp?.commonName ?? '', checkDate: next.date, day: next.d, trays: Number(t.trays ?? 0), overdue: next.date < today, percentSoFar: t.percent_so_far }];
    });

    const entries = await db
      .selectFrom('plan_entries')
      .innerJoin('species', 'species.id', 'plan_entries.species_id')
      .leftJoin('lots', 'lots.id', 'plan_entries.lot_id')
      .select(['plan_entries.id', 'plan_entries.sow_from', 'plan_entries.sow_to', 'plan_entries.seeds_to_sow', 'plan_entries.plants_wanted', 'plan_entries.lot_id', 'plan_entries.sown_on', 'species.common_name', 'lots.code'])
      .where('plan_entries.bank_id', '=', bankId)
      .execute();
    const sowingsDue = entries
      .filter((e) => !e.sown_on && e.sow_from <= weekEnd && e.sow_to >= today)
      .sort((a, b) => a.sow_from.localeCompare(b.sow_from))
      .map((e) => ({ entryId: e.id, species: e.common_name, lotCode: e.code, sowFrom: e.sow_from, sowTo: e.sow_to, seedsToSow: e.seeds_to_sow, plantsWanted: e.plants_wanted, open: e.sow_from <= today }));

    const ranking = await deps.viability.ranking(bankId, today);
    const lotsToRetest = ranking
      .filter((r) => r.recommendation === 'retest' && r.seedsOnHand > 0)
      .slice(0, 12)
      .map((r) => ({ lotId: r.lotId, code: r.code, species: r.species, variety: r.variety, reason: r.reason }));
    const needed = new Map<string, number>();
    for (const e of entries) if (!e.sown_on && e.lot_id && e.seeds_to_sow) needed.set(e.lot_id, (needed.get(e.lot_id) ?? 0) + e.seeds_to_sow);
    const lowStock = ranking
      .filter((r) => r.status === 'active' && (r.seedsOnHand < (needed.get(r.lotId) ?? LOW_STOCK)))
      .map((r) => ({ lotId: r.lotId, code: r.code, species: r.species, variety: r.variety, seedsOnHand: r.seedsOnHand, needed: needed.get(r.lotId) ?? null }));

    respond(res, 200, overviewSchema, {
      today,
      weekEnd,
      traysToCount: traysToCount.sort((a, b) => a.checkDate.localeCompare(b.checkDate)),
      sowingsDue,
      lotsToRetest,
      lowStock,
      counts: { lots: ranking.length, runningTests: running.length, planEntries: entries.filter((e) => daysBetween(today, e.sow_to) >= 0).length },
    });
  });
  return router;
}
