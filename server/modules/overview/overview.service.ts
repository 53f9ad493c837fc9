import { addDays, daysBetween } from '#shared/dates';
import type { Db } from '#server/db/database';
import { listForOverview } from '../plan/plan.shared.repository';
import { checkDays } from '../reminders/reminders.service';
import { listSpecies } from '../species/species.shared.repository';
import type { ViabilityService } from '../viability/viability.service';
import { runningAssaysWithTrays } from './overview.repository';

/** Fewer seeds than this on hand counts as low stock, when no plan says how many are needed. */
const LOW_STOCK = 20;

export function createOverviewService({ db, viability }: { db: Db; viability: ViabilityService }) {
  return {
    /** What needs doing in the bank in the week from `today`. */
    async week(bankId: string, today: string) {
      const weekEnd = addDays(today, 6);
      const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));

      const running = await runningAssaysWithTrays(db, bankId);
      const traysToCount = running.flatMap((t) => {
        const sp = species.get(t.species_id);
        const days = checkDays(sp?.traits.firstCountDay ?? null, sp?.traits.finalCountDay ?? null);
        const lastCount = t.last_count;
        // The next check day not yet counted; an earlier uncounted one is overdue.
        const next = days
          .map((d) => ({ d, date: addDays(t.start_date, d) }))
          .find((c) => !lastCount || c.date > lastCount);
        if (!next || next.date > weekEnd) return [];
        return [
          {
            testId: t.id,
            lotId: t.lot_id,
            lotCode: t.code,
            species: sp?.commonName ?? '',
            checkDate: next.date,
            day: next.d,
            trays: Number(t.trays ?? 0),
            overdue: next.date < today,
            percentSoFar: t.percent_so_far,
            percentSoFarEstimated: t.percent_estimated,
          },
        ];
      });

      const entries = await listForOverview(db, bankId);
      const sowingsDue = entries
        .filter((e) => !e.sown_on && e.sow_from <= weekEnd && e.sow_to >= today)
        .sort((a, b) => a.sow_from.localeCompare(b.sow_from))
        .map((e) => ({
          entryId: e.id,
          species: e.common_name,
          lotCode: e.code,
          sowFrom: e.sow_from,
          sowTo: e.sow_to,
          seedsToSow: e.seeds_to_sow,
          plantsWanted: e.plants_wanted,
          open: e.sow_from <= today,
        }));

      const ranking = await viability.ranking(bankId, today);
      const lotsToRetest = ranking
        .filter((r) => r.recommendation === 'retest' && (r.seedsOnHand === null || r.seedsOnHand > 0))
        .slice(0, 12)
        .map((r) => ({
          lotId: r.lotId,
          code: r.code,
          species: r.species,
          variety: r.variety,
          reason: r.reason,
        }));
      const needed = new Map<string, number>();
      for (const e of entries)
        if (!e.sown_on && e.lot_id && e.seeds_to_sow)
          needed.set(e.lot_id, (needed.get(e.lot_id) ?? 0) + e.seeds_to_sow);
      // A lot whose amount is not known is never low stock: not known is not few.
      const lowStock = ranking
        .flatMap((r) => (r.seedsOnHand === null ? [] : [{ ...r, seedsOnHand: r.seedsOnHand }]))
        .filter((r) => r.status === 'active' && r.seedsOnHand < (needed.get(r.lotId) ?? LOW_STOCK))
        .map((r) => ({
          lotId: r.lotId,
          code: r.code,
          species: r.species,
          variety: r.variety,
          seedsOnHand: r.seedsOnHand,
          needed: needed.get(r.lotId) ?? null,
        }));

      return {
        today,
        weekEnd,
        traysToCount: traysToCount.sort((a, b) => a.checkDate.localeCompare(b.checkDate)),
        sowingsDue,
        lotsToRetest,
        lowStock,
        counts: {
          lots: ranking.length,
          runningTests: running.length,
          planEntries: entries.filter((e) => daysBetween(today, e.sow_to) >= 0).length,
        },
      };
    },
  };
}

export type OverviewService = ReturnType<typeof createOverviewService>;
