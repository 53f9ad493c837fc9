import type { z } from 'zod';
import { planDates, PlanDateError } from '#shared/plan-dates';
import type {
  CreatePlanBody,
  EmergenceBody,
  EmergenceRecordDto,
  PlanEntryDto,
  SownBody,
  updatePlanBodySchema,
} from '#shared/schemas/plan';
import { bankToday, type Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { AppError, badRequest, conflict, notFound, unprocessable } from '#server/http/errors';
import { bankName } from '../banks/banks.shared.repository';
import { insertMovement, lockLot, stockOf, updateLot } from '../lots/lots.shared.repository';
import { findSpecies } from '../species/species.shared.repository';
import type { ViabilityService } from '../viability/viability.service';
import { dayInWords } from '#shared/day-words';
import { planCalendar, type ExtraEvent } from './plan-calendar';
import { dateInputs, entryDates, moveDto, withLiveDates, type LiveDates } from './plan-live';
import * as repo from './plan.repository';

export type { ExtraEvent } from './plan-calendar';

export function createPlanService({
  db,
  clock,
  viability,
}: {
  db: Db;
  clock: Clock;
  viability: ViabilityService;
}) {
  const emergenceDto = (e: repo.EmergenceRow): EmergenceRecordDto => ({
    id: e.id,
    date: e.date,
    seedlings: e.seedlings,
    score: e.score,
    sownOn: e.sown_on,
    seedsSown: e.seeds_sown,
    percent: e.seedlings === null ? null : (100 * e.seedlings) / e.seeds_sown,
    latest: e.latest,
  });

  type LiveRow = repo.PlanEntryRow & { live: LiveDates };

  /** Each entry with its dates now and what came up from its sowing (one read for them all). */
  async function withEmergence(bankId: string, plain: repo.PlanEntryRow[]): Promise<PlanEntryDto[]> {
    const rows = await withLiveDates(db, bankId, plain);
    const sown = rows.filter((r) => r.sown_on !== null).map((r) => r.id);
    const byEntry = new Map<string, EmergenceRecordDto[]>();
    for (const e of await repo.emergenceOfEntries(db, bankId, sown)) {
      const list = byEntry.get(e.plan_entry_id);
      if (list) list.push(emergenceDto(e));
      else byEntry.set(e.plan_entry_id, [emergenceDto(e)]);
    }
    return rows.map((r) => toDto(r, byEntry.get(r.id) ?? []));
  }

  const toDto = (r: LiveRow, emergence: EmergenceRecordDto[]): PlanEntryDto => ({
    id: r.id,
    season: r.season,
    speciesId: r.species_id,
    speciesName: r.species_name,
    lotId: r.lot_id,
    lotCode: r.lot_code,
    lotChosen: r.lot_chosen,
    plantsWanted: r.plants_wanted,
    start: r.start,
    seedsToSow: r.seeds_to_sow,
    // Null too when the lot's amount is not known: never read as zero.
    seedsOnHand: r.lot_id === null || r.amount_kind === 'unknown' ? null : (r.seeds_on_hand ?? 0),
    sowFrom: r.live.sowFrom,
    sowTo: r.live.sowTo,
    expectFrom: r.live.expectFrom,
    expectBy: r.live.expectBy,
    hardenFrom: r.live.hardenFrom,
    transplantOn: r.live.transplantOn,
    // The dates' notes as they are now, then the lot's as last worked out.
    notes: [...r.live.notes, ...((r.notes as string[] | null) ?? [])],
    sownOn: r.sown_on,
    hardiness: r.live.hardiness,
    succession:
      r.succession_id && r.succession_no && r.succession_weeks
        ? {
            id: r.succession_id,
            number: r.succession_no,
            of: Number(r.succession_of ?? 1),
            everyWeeks: r.succession_weeks,
          }
        : null,
    emergence,
    forSeed: r.for_seed,
    seedSeason: r.live.seedSeason,
    overwinterFrom: r.live.overwinterFrom,
    overwinterTo: r.live.overwinterTo,
  });

  async function get(bankId: string, entryId: string) {
    const row = await repo.findEntry(db, bankId, entryId);
    if (!row) throw notFound('No such plan entry in this bank.');
    return (await withEmergence(bankId, [row]))[0]!;
  }

  /** Dates from the frost date, the suggested (or chosen) lot, and the seeds to sow. */
  async function compute(
    bankId: string,
    input: {
      season: number;
      speciesId: string;
      plantsWanted: number;
      start: 'indoors' | 'direct';
      lotId: string | null;
      offsetDays: number;
    },
  ) {
    const bank = await repo.frostSettings(db, bankId);
    const species = await findSpecies(db, bankId, input.speciesId);
    if (!species)
      throw badRequest('That species is not in the list.', { speciesId: 'Choose a species from the list.' });
    let dates;
    try {
      dates = planDates({
        season: input.season,
        lastFrost: bank.last_frost,
        marginDays: bank.frost_margin_days,
        traits: species.traits,
        start: input.start,
        offsetDays: input.offsetDays,
      });
    } catch (error) {
      if (error instanceof PlanDateError) throw unprocessable(error.message);
      throw error;
    }
    // Only the lot's notes are kept: the dates' own are worked out again on every read.
    const notes: string[] = [];
    const candidates = await viability.candidates(bankId, species.id, dates.sowFrom, input.plantsWanted);
    let lotId = input.lotId;
    let seeds: number | null = null;
    if (lotId) {
      const lot = await repo.findLotOfBank(db, bankId, lotId);
      if (!lot || lot.species_id !== species.id)
        throw badRequest('Choose a lot of this species from this bank.', {
          lotId: 'Not a lot of this species.',
        });
      const c = candidates.find((x) => x.lotId === lotId);
      if (c) {
        seeds = c.seeds;
        if (c.enough === null)
          notes.push(
            `Lot ${c.code}'s amount is not known; ${c.seeds} seeds are needed for ${input.plantsWanted} plants.`,
          );
        else if (!c.enough)
          notes.push(
            `Lot ${c.code} has ${c.seedsOnHand} seeds; ${c.seeds} are needed for ${input.plantsWanted} plants.`,
          );
      } else {
        notes.push(
          'The chosen lot has no germination test yet, so the seeds to sow cannot be worked out. Test it first.',
        );
      }
    } else {
      const best = candidates[0];
      if (!best) {
        notes.push(
          `No tested lot of ${species.commonName} to suggest. Log a lot and test it, or choose one.`,
        );
      } else {
        lotId = best.lotId;
        seeds = best.seeds;
        notes.push(
          best.enough !== false
            ? `Suggested lot ${best.code}: projected ${Math.round(best.projected.percent)}% (at least ${Math.round(best.projected.low)}%) when sowing starts.`
            : `No lot has enough seed: the best, ${best.code}, has ${best.seedsOnHand} of the ${best.seeds} needed.`,
        );
      }
    }
    return { dates, notes, lotId, seeds };
  }

  /** The season's entries with their dates now, in sowing order. */
  async function list(bankId: string, season: number) {
    return withEmergence(bankId, await repo.listSeason(db, bankId, season));
  }

  /** The stored columns of a plan: the dates as now planned and the lot as worked out. */
  const planned = (c: Awaited<ReturnType<typeof compute>>) => ({
    lot_id: c.lotId,
    seeds_to_sow: c.seeds,
    sow_from: c.dates.sowFrom,
    sow_to: c.dates.sowTo,
    expect_from: c.dates.expectFrom,
    expect_by: c.dates.expectBy,
    harden_from: c.dates.hardenFrom,
    transplant_on: c.dates.transplantOn,
    notes: JSON.stringify(c.notes),
  });

  return {
    get,
    list,

    /** The latest frost-date move of a season's plan, in words, or null. */
    async latestMove(bankId: string, season: number) {
      const row = await repo.latestMove(db, bankId, season);
      return row ? moveDto(row) : null;
    },

    /** The season's plan and the retests due (and any `extra` events), as an iCalendar file. */
    async calendar(bankId: string, season: number, extra: ExtraEvent[] = []) {
      const bank = await bankName(db, bankId);
      const entries = await list(bankId, season);
      const ranking = await viability.ranking(bankId, `${season}-01-01`);
      const retests = ranking
        .filter((r) => r.retestBy)
        .map((r) => ({ lotId: r.lotId, code: r.code, species: r.species, retestBy: r.retestBy! }));
      return planCalendar(bank.name, season, entries, retests, extra);
    },

    /**
     * Plans a sowing, or a succession of them: `succession.sowings` entries, each
     * `succession.everyWeeks` weeks after the one before, with its own dates, lot and seeds.
     */
    async create(bankId: string, userId: string, body: CreatePlanBody) {
      const sowings = body.succession?.sowings ?? 1;
      const everyWeeks = body.succession?.everyWeeks ?? null;
      const plans: { offsetDays: number; c: Awaited<ReturnType<typeof compute>> }[] = [];
      for (let i = 0; i < sowings; i++) {
        const offsetDays = i * 7 * (everyWeeks ?? 0);
        plans.push({
          offsetDays,
          c: await compute(bankId, { ...body, lotId: body.lotId ?? null, offsetDays }),
        });
      }
      const ids = await db.transaction().execute(async (trx) => {
        const successionId = body.succession ? crypto.randomUUID() : null;
        const out: string[] = [];
        for (const [i, p] of plans.entries()) {
          const row = await repo.insertEntry(trx, {
            bank_id: bankId,
            season: body.season,
            species_id: body.speciesId,
            lot_chosen: Boolean(body.lotId),
            plants_wanted: body.plantsWanted,
            start: body.start,
            ...planned(p.c),
            succession_id: successionId,
            succession_no: successionId ? i + 1 : null,
            succession_weeks: everyWeeks,
            offset_days: p.offsetDays,
            for_seed: body.forSeed ?? false,
            created_by: userId,
          });
          out.push(row.id);
        }
        return out;
      });
      const entries = await withEmergence(bankId, await repo.findEntries(db, bankId, ids));
      entries.sort((x, y) => (x.succession?.number ?? 1) - (y.succession?.number ?? 1));
      return { entry: entries[0]!, entries };
    },

    async update(bankId: string, entryId: string, body: z.infer<typeof updatePlanBodySchema>) {
      const row = await repo.findEntry(db, bankId, entryId);
      if (!row) throw notFound('No such plan entry in this bank.');
      const current = await get(bankId, entryId);
      if (current.sownOn)
        throw conflict('This entry is marked sown. Undo that first to change it.', 'already_sown');
      const lotChosen = body.lotId !== undefined ? body.lotId !== null : current.lotChosen;
      const input = {
        season: current.season,
        speciesId: current.speciesId,
        plantsWanted: body.plantsWanted ?? current.plantsWanted,
        start: body.start ?? current.start,
        lotId: body.lotId !== undefined ? body.lotId : current.lotChosen ? current.lotId : null,
        offsetDays: row.offset_days,
      };
      const c = await compute(bankId, input);
      await repo.updateEntry(db, entryId, {
        ...planned(c),
        lot_chosen: lotChosen,
        plants_wanted: input.plantsWanted,
        start: input.start,
        ...(body.forSeed !== undefined ? { for_seed: body.forSeed } : {}),
        updated_at: clock.now(),
      });
      return get(bankId, entryId);
    },

    async remove(bankId: string, entryId: string) {
      const current = await get(bankId, entryId);
      if (current.sownOn)
        throw conflict(
          'This entry is marked sown. Undo that first, so the seeds go back to the lot.',
          'already_sown',
        );
      await repo.deleteEntry(db, entryId);
    },

    /**
     * Withdraws the entry's seeds from its lot, once, in one transaction with the mark, and keeps
     * the dates it was sown under. The day is always the grower's choice; a day outside the sowing
     * window is 409 `outside_window` unless confirmed, and a day after the bank's today is 422.
     */
    async markSown(bankId: string, entryId: string, userId: string, body: SownBody) {
      const today = await bankToday(db, clock, bankId);
      const on = body.date;
      if (on > today)
        throw unprocessable(`A sowing cannot be dated after today (${dayInWords(today)}).`, {
          date: 'Use today or an earlier date.',
        });
      await db.transaction().execute(async (trx) => {
        const entry = await repo.lockEntry(trx, bankId, entryId);
        if (!entry) throw notFound('No such plan entry in this bank.');
        if (entry.sown_on) throw conflict(`Already marked sown on ${entry.sown_on}.`, 'already_sown');
        const dates = entryDates(await dateInputs(trx, bankId), entry, on);
        if ((on < dates.sowFrom || on > dates.sowTo) && body.confirm !== true) {
          const window = `${dayInWords(dates.sowFrom)} – ${dayInWords(dates.sowTo)}`;
          throw new AppError(
            409,
            'outside_window',
            `${dayInWords(on)} is ${on < dates.sowFrom ? 'before' : 'after'} this sowing window (${window}). Was it really sown then? Send it again with confirm to record it.`,
            { date: `Outside the sowing window, ${window}.` },
          );
        }
        if (!entry.lot_id || !entry.seeds_to_sow)
          throw unprocessable(
            'Choose a tested lot for this entry first, so Hilum knows how many seeds to take.',
          );
        const lot = await lockLot(trx, bankId, entry.lot_id);
        if (!lot) throw notFound('The lot of this entry is gone.');
        const onHand = await stockOf(trx, entry.lot_id);
        // null: the lot's amount is not known, so the sowing is recorded and nothing is refused.
        if (onHand !== null && onHand < entry.seeds_to_sow) {
          throw new AppError(
            409,
            'stock_below_zero',
            `The lot has ${onHand} seeds; this sowing needs ${entry.seeds_to_sow}. Sow fewer or choose another lot.`,
          );
        }
        const movement = await insertMovement(trx, {
          lot_id: entry.lot_id,
          kind: 'sown',
          change: -entry.seeds_to_sow,
          date: on,
          reason: `Sown for ${entry.plants_wanted} plants (season plan ${entry.season})`,
          created_by: userId,
        });
        // Sown: the dates it was sown under are kept, seedlings expected counted from its day.
        await repo.updateEntry(trx, entryId, {
          sown_on: on,
          sown_movement_id: movement.id,
          sow_from: dates.sowFrom,
          sow_to: dates.sowTo,
          expect_from: dates.expectFrom,
          expect_by: dates.expectBy,
          harden_from: dates.hardenFrom,
          transplant_on: dates.transplantOn,
          updated_at: clock.now(),
        });
        if (onHand !== null && onHand === entry.seeds_to_sow && lot.status === 'active') {
          await updateLot(trx, entry.lot_id, { status: 'depleted' });
        }
      });
      return get(bankId, entryId);
    },

    /**
     * Records what came up from a sowing by `date`: the seedlings counted, or a rough score. Every
     * record is kept; the latest of a sowing (by date, then by when written) is what came up, and
     * the lot's viability reads it as field emergence. Only for an entry marked sown (409), dated
     * from the sowing day to today (422), with no more seedlings than seeds sown (422).
     */
    async recordEmergence(bankId: string, entryId: string, userId: string, body: EmergenceBody) {
      const today = await bankToday(db, clock, bankId);
      const id = await db.transaction().execute(async (trx) => {
        // Locked, so an undo of the sowing cannot slip in between the check and the write.
        const entry = await repo.lockEntry(trx, bankId, entryId);
        if (!entry) throw notFound('No such plan entry in this bank.');
        if (!entry.sown_on || !entry.lot_id)
          throw conflict('This entry is not marked sown: mark it sown first.', 'not_sown');
        const movement = entry.sown_movement_id ? await repo.sownMovement(trx, entry.sown_movement_id) : null;
        if (!movement)
          throw conflict(
            'The stock line of this sowing is gone, so Hilum does not know how many seeds were sown. Undo the sowing and mark it again.',
            'not_sown',
          );
        const seedsSown = -movement.change;
        if (body.date > today)
          throw unprocessable('What came up cannot be dated in the future.', {
            date: 'Use today or an earlier date.',
          });
        if (body.date < entry.sown_on)
          throw unprocessable(
            `This was sown on ${dayInWords(entry.sown_on)}: what came up is dated on or after that.`,
            {
              date: `On or after ${entry.sown_on}.`,
            },
          );
        if (typeof body.seedlings === 'number' && body.seedlings > seedsSown)
          throw unprocessable(`${body.seedlings} seedlings is more than the ${seedsSown} seeds sown.`, {
            seedlings: `At most ${seedsSown}.`,
          });
        const row = await repo.insertEmergence(trx, {
          bank_id: bankId,
          plan_entry_id: entryId,
          lot_id: entry.lot_id,
          sown_movement_id: movement.id,
          sown_on: entry.sown_on,
          seeds_sown: seedsSown,
          date: body.date,
          seedlings: body.seedlings ?? null,
          score: body.score ?? null,
          created_by: userId,
        });
        return row.id;
      });
      const entry = await get(bankId, entryId);
      return { entry, emergence: entry.emergence.find((e) => e.id === id)! };
    },

    /**
     * Puts the seeds back: the ledger line goes, the mark goes, and with the ledger line what was
     * recorded as coming up from the sowing (its foreign key cascades).
     */
    async undoSown(bankId: string, entryId: string) {
      await db.transaction().execute(async (trx) => {
        const entry = await repo.lockEntry(trx, bankId, entryId);
        if (!entry) throw notFound('No such plan entry in this bank.');
        if (!entry.sown_on) throw conflict('This entry is not marked sown.', 'not_sown');
        if (entry.sown_movement_id) await repo.deleteMovement(trx, entry.sown_movement_id);
        await repo.updateEntry(trx, entryId, {
          sown_on: null,
          sown_movement_id: null,
          updated_at: clock.now(),
        });
        if (entry.lot_id) {
          const lot = await lockLot(trx, bankId, entry.lot_id);
          if (lot?.status === 'depleted' && ((await stockOf(trx, entry.lot_id)) ?? 0) > 0) {
            await updateLot(trx, entry.lot_id, { status: 'active' });
          }
        }
      });
      return get(bankId, entryId);
    },
  };
}

export type PlanService = ReturnType<typeof createPlanService>;
