import type {
  AmountInput,
  AmountKind,
  CreateLotBody,
  SeedWeightBody,
  StockBody,
  UpdateLotBody,
} from '#shared/schemas/lots';
import type { SeedWeightSources } from '#server/stats/index';
import { weighedAmount, weighedAmountWords } from './lot-seed-weight';
import { bankToday, type Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { LotStatus, LotTable } from '#server/db/schema';
import type { LotCsvRow, ParsedLotCsvRow } from './lots.csv';
import { AppError, badRequest, conflict, invalidCsv, notFound, unprocessable } from '#server/http/errors';
import { requireSpecies } from '../species/species.shared.repository';
import { codePrefix, nextCode } from './lot-code';
import * as repo from './lots.repository';
import * as lineage from './lineage.repository';
import { buildLineage, lineageCycle } from './lot-lineage';
import type { Insertable, Updateable } from 'kysely';
import crypto from 'node:crypto';
import { inBatches } from '#server/db/batches';
import { dayInWords } from '#shared/day-words';

function uniqueViolation(error: unknown): boolean {
  return (error as { code?: string }).code === '23505';
}

export interface LotsServiceDeps {
  db: Db;
  clock: Clock;
  /** Removes photo objects from the store after their rows are gone (photos module). */
  removeSubjectPhotos: (
    db: DbOrTx,
    bankId: string,
    subject: 'lot',
    subjectId: string,
  ) => Promise<() => Promise<void>>;
  /** Whether the lot has germination tests, which keep it from being deleted outright. */
  hasAssays: (db: DbOrTx, lotId: string) => Promise<boolean>;
}

/** Seed is harvested on or before today, on the bank's calendar. */
function refuseFutureHarvest(harvestDate: string, today: string) {
  if (harvestDate > today) {
    throw unprocessable('A harvest date cannot be in the future.', {
      harvestDate: 'Use the day the seed was harvested.',
    });
  }
}

/**
 * A corrected harvest date may not lie in the future on the bank's calendar, nor after a
 * germination test of the lot started (seed is tested after it is harvested).
 */
async function checkHarvestChange(
  trx: DbOrTx,
  bankId: string,
  lotId: string,
  harvestDate: string,
  clock: Clock,
) {
  refuseFutureHarvest(harvestDate, await bankToday(trx, clock, bankId));
  const first = await repo.firstAssayStart(trx, lotId);
  if (first && harvestDate > first.start_date) {
    throw unprocessable(
      `A germination test of this lot started on ${dayInWords(first.start_date)}, before that harvest date.`,
      {
        harvestDate: `Use a day on or before ${dayInWords(first.start_date)}.`,
      },
    );
  }
}

type Species = Awaited<ReturnType<typeof requireSpecies>>;
type LotExtra = { status?: LotStatus; quantityEstimated?: boolean; reason?: string; movementDate?: string };

/** The amount a new lot's body gives: `amount`, or its short forms seedCount and grams; none is not known. */
function amountInputOf(body: CreateLotBody, extra: LotExtra): AmountInput {
  if (body.amount) return body.amount;
  if (body.grams !== undefined) return { kind: 'weighed', grams: body.grams };
  if (body.seedCount === undefined) return { kind: 'unknown' };
  return extra.quantityEstimated && body.seedCount > 0
    ? { kind: 'estimated', seeds: body.seedCount }
    : { kind: 'counted', seeds: body.seedCount };
}

/** An amount with its seeds worked out (null: not known), and how it was found, in words. */
interface ResolvedAmount {
  kind: AmountKind;
  seeds: number | null;
  grams: number | null;
  words: string;
}

/** Turns an amount as given into seeds; a weight through the lot's seed weight, else its species'. */
function resolveAmount(input: AmountInput, sources: SeedWeightSources, speciesName: string): ResolvedAmount {
  switch (input.kind) {
    case 'unknown':
      return { kind: 'unknown', seeds: null, grams: null, words: 'Amount not known' };
    case 'counted':
      return { kind: 'counted', seeds: input.seeds, grams: null, words: `Counted: ${input.seeds} seeds` };
    case 'estimated':
      return {
        kind: 'estimated',
        seeds: input.seeds,
        grams: null,
        words: `Estimated: about ${input.seeds} seeds`,
      };
    case 'weighed': {
      const weighed = weighedAmount(input.grams, sources);
      if (!weighed) {
        throw badRequest('Neither this lot nor its species has a seeds-per-gram figure.', {
          grams: `No seeds-per-gram figure for ${speciesName}: count the seeds or say about how many, then weigh a sample on the lot's page.`,
          'amount.grams': `No seeds-per-gram figure for ${speciesName} yet: weigh a sample of this lot first, or give the amount another way.`,
        });
      }
      return {
        kind: 'weighed',
        seeds: weighed.seeds,
        grams: input.grams,
        words: `Estimated from ${input.grams} g at ${weighedAmountWords(weighed)}`,
      };
    }
  }
}

/** The lot row's columns for an amount (quantity_estimated and grams_entered kept in step). */
function amountColumns(amount: ResolvedAmount) {
  return {
    amount_kind: amount.kind,
    quantity_estimated: amount.kind === 'estimated' || amount.kind === 'weighed',
    grams_entered: amount.grams,
    weighed_seeds: amount.kind === 'weighed' ? amount.seeds : null,
  };
}

/** The bank's lot codes, lower-cased (codes are unique in a bank in any letter case). */
async function takenCodes(db: DbOrTx, bankId: string): Promise<Set<string>> {
  return new Set((await repo.bankCodes(db, bankId)).map((code) => code.toLowerCase()));
}

/** What only the bank can tell of an import's rows: codes it already uses, harvests after its today. */
function importProblems(rows: ParsedLotCsvRow[], taken: Set<string>, today: string) {
  return rows.flatMap((r) => [
    ...(r.code && taken.has(r.code.toLowerCase())
      ? [{ line: r.line, column: 'code', message: `The code ${r.code} is already used in this bank.` }]
      : []),
    ...(r.harvestDate !== null && r.harvestDate > today
      ? [
          {
            line: r.line,
            column: 'harvest_date',
            message: `${r.harvestDate} is after today (${dayInWords(today)} in the bank's time zone); use the day the seed was harvested.`,
          },
        ]
      : []),
  ]);
}

/** A CSV row as the body of a new lot. */
function csvLotBody(row: ParsedLotCsvRow): CreateLotBody {
  return {
    speciesId: row.speciesId,
    variety: row.variety,
    origin: row.origin,
    sourceName: row.sourceName,
    harvestDate: row.harvestDate,
    packedForSeason: row.packedForSeason,
    plantsBulked: row.plantsBulked,
    storage: {
      place: row.storagePlace,
      location: row.storageLocation,
      temperatureC: row.storageTempC,
      humidityPct: row.storageHumidityPct,
    },
    notes: row.notes,
    treated: row.treated,
    ...(row.code ? { code: row.code } : {}),
    ...(row.seedsOnHand !== null ? { seedCount: row.seedsOnHand } : {}),
  };
}

/**
 * Hands out codes for many new lots at once, each the next free number after every code in `used`
 * and every one handed out before under the same prefix (what nextCode gives one lot at a time).
 */
function codeAllocator(used: string[]): (prefix: string) => string {
  const last = new Map<string, string>();
  return (prefix) => {
    const previous = last.get(prefix);
    const code = nextCode(prefix, previous ? [previous] : used);
    last.set(prefix, code);
    return code;
  };
}

/** An emptied lot is depleted; seeds found again bring it back. */
async function followStock(trx: DbOrTx, lotId: string, status: LotStatus, seedsOnHand: number) {
  if (seedsOnHand === 0 && status === 'active') await repo.updateLot(trx, lotId, { status: 'depleted' });
  if (seedsOnHand > 0 && status === 'depleted') await repo.updateLot(trx, lotId, { status: 'active' });
}

export function createLotsService(deps: LotsServiceDeps) {
  const { db, clock } = deps;

  async function get(bankId: string, lotId: string, on: DbOrTx = db) {
    const row = await repo.lotsQuery(on, bankId).where('lots.id', '=', lotId).executeTakeFirst();
    if (!row) throw notFound('No such lot in this bank.');
    // Generations: the read of one lot carries its line.
    return { ...repo.toLotDto(row), lineage: buildLineage(lotId, await lineage.lineRows(on, bankId, lotId)) };
  }

  /** Generations: refuses parent plants grown from this lot or from a lot that descends from it. */
  async function refuseCycle(trx: DbOrTx, bankId: string, lotId: string, plantIds: string[]) {
    await lineage.lockLineage(trx, bankId);
    for (const plant of await lineage.grownFromOfPlants(trx, bankId, plantIds)) {
      if (await lineage.makesCycle(trx, bankId, [lotId], plant.grown_from_lot_id!)) {
        throw lineageCycle('parentPlantIds');
      }
    }
  }

  async function checkParents(trx: DbOrTx, bankId: string, ids: string[] | undefined) {
    if (!ids?.length) return;
    const found = await repo.parentPlantsOfBank(trx, bankId, ids);
    if (found.length !== new Set(ids).size) {
      throw badRequest('A parent plant is not in this bank.', {
        parentPlantIds: 'Choose parent plants from this bank.',
      });
    }
  }

  function storageColumns(storage: CreateLotBody['storage']): Updateable<LotTable> {
    if (!storage) return {};
    const out: Updateable<LotTable> = {};
    if (storage.place !== undefined) out.storage_place = storage.place;
    if (storage.location !== undefined) out.storage_location = storage.location;
    if (storage.temperatureC !== undefined) out.storage_temp_c = storage.temperatureC;
    if (storage.humidityPct !== undefined) out.storage_humidity_pct = storage.humidityPct;
    return out;
  }

  /**
   * A new lot's row (all but its code) and its first stock movement (all but the lot's id), from
   * what the person or the file gave; `today` is the bank's (bankToday). No I/O.
   */
  function newLot(
    bankId: string,
    userId: string,
    today: string,
    species: Species,
    body: CreateLotBody,
    extra: LotExtra = {},
  ) {
    if (body.harvestDate) refuseFutureHarvest(body.harvestDate, today);
    const amount = resolveAmount(
      amountInputOf(body, extra),
      {
        species: species.traits.seedsPerGram ? { seedsPerGram: species.traits.seedsPerGram } : null,
      },
      species.commonName,
    );
    const row = {
      bank_id: bankId,
      species_id: species.id,
      variety: body.variety,
      origin: body.origin,
      source_name: body.sourceName ?? null,
      harvest_date: body.harvestDate ?? null,
      packed_for_season: body.packedForSeason ?? null,
      plants_bulked: body.plantsBulked ?? null,
      ...storageColumns(body.storage),
      ...amountColumns(amount),
      notes: body.notes ?? null,
      treated: body.treated ?? false,
      created_by: userId,
      ...(extra.status ? { status: extra.status } : {}),
    } satisfies Omit<Insertable<LotTable>, 'code'>;
    const movement =
      amount.seeds !== null && amount.seeds > 0
        ? {
            kind: 'initial' as const,
            change: amount.seeds,
            date: extra.movementDate ?? body.harvestDate ?? today,
            reason: extra.reason ?? `${amount.words} when the lot was logged`,
            created_by: userId,
          }
        : null;
    return {
      row,
      movement,
      prefix: codePrefix(
        species.commonName,
        body.harvestDate ? Number(body.harvestDate.slice(0, 4)) : body.packedForSeason!,
      ),
    };
  }

  /** Writes one lot and its first stock movement inside `trx`; `today` is the bank's (bankToday). */
  async function insertLot(
    trx: DbOrTx,
    bankId: string,
    userId: string,
    today: string,
    body: CreateLotBody,
    extra: LotExtra = {},
  ): Promise<string> {
    const species = await requireSpecies(trx, bankId, body.speciesId);
    await checkParents(trx, bankId, body.parentPlantIds);
    const { row, movement, prefix } = newLot(bankId, userId, today, species, body, extra);
    // Given codes too: one committed between our read of the codes and our insert would collide.
    await repo.lockLotCodes(trx, bankId);
    const code = body.code ?? nextCode(prefix, await repo.codesLike(trx, bankId, prefix));
    let inserted;
    try {
      inserted = await repo.insertLot(trx, { ...row, code });
    } catch (error) {
      if (uniqueViolation(error))
        throw conflict(`The code ${code} is already used in this bank.`, 'duplicate_code');
      throw error;
    }
    await repo.setParents(trx, inserted.id, body.parentPlantIds ?? []);
    if (movement) await repo.insertMovement(trx, { ...movement, lot_id: inserted.id });
    return inserted.id;
  }

  /**
   * Sets the lot's amount as the grower now knows it: the ledger gets one line that brings its sum
   * to the new seeds ('initial' when the amount was not known before, else a correction), so every
   * earlier movement stays on record. 'unknown' only marks the amount not known.
   */
  async function setAmount(trx: DbOrTx, bankId: string, lotId: string, userId: string, input: AmountInput) {
    const lot = await repo.lockLot(trx, bankId, lotId);
    if (!lot) throw notFound('No such lot in this bank.');
    const figures = await repo.lotSeedWeightFigures(trx, bankId, lotId);
    const species = await repo.lotSpeciesName(trx, lotId);
    const amount = resolveAmount(input, figures?.sources ?? {}, species);
    await repo.updateLot(trx, lotId, { ...amountColumns(amount), updated_at: clock.now() });
    if (amount.seeds === null) return;
    const sum = await repo.ledgerSum(trx, lotId);
    if (amount.seeds !== sum) {
      await repo.insertMovement(trx, {
        lot_id: lotId,
        kind: lot.amount_kind === 'unknown' ? 'initial' : 'correction',
        change: amount.seeds - sum,
        date: await bankToday(trx, clock, bankId),
        reason: `${amount.words} (amount set)`,
        created_by: userId,
      });
    }
    await followStock(trx, lotId, lot.status, amount.seeds);
  }

  /**
   * The one way seeds move in or out of a lot's ledger by hand or between banks, inside the caller's
   * transaction: the lot is locked, a withdrawal below zero is refused (409), and an emptied lot is
   * depleted (a lot whose amount is not known refuses nothing).
   */
  async function moveStock(trx: DbOrTx, bankId: string, lotId: string, userId: string, body: StockBody) {
    const lot = await repo.lockLot(trx, bankId, lotId);
    if (!lot) throw notFound('No such lot in this bank.');
    const before = await repo.stockOf(trx, lotId);
    if (before !== null && before + body.change < 0) {
      throw conflict(
        `Only ${before} seeds are on hand; taking ${-body.change} would leave the stock below zero.`,
        'stock_below_zero',
      );
    }
    const movement = await repo.insertMovement(trx, {
      lot_id: lotId,
      kind: body.kind ?? 'correction',
      change: body.change,
      date: body.date,
      reason: body.reason,
      created_by: userId,
    });
    // Not known before, not known after: the movement is kept, the amount stays unknown.
    const after = before === null ? null : before + body.change;
    if (after !== null) await followStock(trx, lotId, lot.status, after);
    return { movementId: movement.id, seedsOnHand: after };
  }

  return {
    get,

    async list(
      bankId: string,
      query: {
        limit: number;
        cursor?: string;
        q?: string;
        speciesId?: string;
        status?: 'active' | 'depleted' | 'retired';
      },
    ) {
      const rows = await repo.lotsPage(db, bankId, query);
      const page = rows.slice(0, query.limit);
      return {
        items: page.map(repo.toLotDto),
        nextCursor: rows.length > query.limit ? (page[page.length - 1]?.code.toLowerCase() ?? null) : null,
      };
    },

    async create(bankId: string, userId: string, body: CreateLotBody) {
      const lotId = await db
        .transaction()
        .execute(async (trx) => insertLot(trx, bankId, userId, await bankToday(trx, clock, bankId), body));
      return get(bankId, lotId);
    },

    async exportRows(bankId: string): Promise<LotCsvRow[]> {
      const rows = await repo.lotsByCode(db, bankId);
      return rows.map(repo.toLotDto).map((l) => ({
        code: l.code,
        speciesName: l.speciesName,
        scientificName: l.scientificName,
        variety: l.variety,
        origin: l.origin,
        sourceName: l.sourceName,
        harvestDate: l.harvestDate,
        packedForSeason: l.packedForSeason,
        seedsOnHand: l.seedsOnHand,
        quantityEstimated: l.quantityEstimated,
        treated: l.treated,
        plantsBulked: l.plantsBulked,
        storagePlace: l.storage.place,
        storageLocation: l.storage.location,
        storageTempC: l.storage.temperatureC,
        storageHumidityPct: l.storage.humidityPct,
        status: l.status,
        notes: l.notes,
      }));
    },

    /**
     * Imports parsed CSV rows: every lot, or none (API.md). Everything is checked and prepared
     * first; the transaction only takes the bank's code lock, checks the codes again, and writes
     * the lots and their first movements in multi-row batches, so a 5,000-row file holds a
     * connection for well under a second.
     */
    async importRows(bankId: string, userId: string, rows: ParsedLotCsvRow[]) {
      const today = await bankToday(db, clock, bankId);
      const refuse = (taken: Set<string>) => {
        const problems = importProblems(rows, taken, today);
        if (problems.length) throw invalidCsv(problems);
      };
      refuse(await takenCodes(db, bankId));
      const species = new Map<string, Species>();
      for (const id of new Set(rows.map((r) => r.speciesId))) {
        species.set(id, await requireSpecies(db, bankId, id));
      }
      const lots = rows.map((r) => ({
        id: crypto.randomUUID(),
        code: r.code || null,
        ...newLot(bankId, userId, today, species.get(r.speciesId)!, csvLotBody(r), {
          status: r.status,
          quantityEstimated: r.quantityEstimated,
          reason: 'Imported from a CSV file',
        }),
      }));
      return db.transaction().execute(async (trx) => {
        await repo.lockLotCodes(trx, bankId);
        const codes = await repo.bankCodes(trx, bankId);
        refuse(new Set(codes.map((c) => c.toLowerCase())));
        const allocate = codeAllocator([...codes, ...lots.flatMap((l) => (l.code ? [l.code] : []))]);
        const values = lots.map((l) => ({ ...l.row, id: l.id, code: l.code ?? allocate(l.prefix) }));
        await inBatches(values, 500, (batch) => repo.insertLots(trx, batch));
        const movements = lots.flatMap((l) => (l.movement ? [{ ...l.movement, lot_id: l.id }] : []));
        await inBatches(movements, 1000, (batch) => repo.insertMovements(trx, batch));
        return rows.length;
      });
    },

    async update(bankId: string, lotId: string, userId: string, body: UpdateLotBody) {
      await db.transaction().execute(async (trx) => {
        const lot = await repo.lockLot(trx, bankId, lotId);
        if (!lot) throw notFound('No such lot in this bank.');
        if (body.speciesId) await requireSpecies(trx, bankId, body.speciesId);
        await checkParents(trx, bankId, body.parentPlantIds);
        if (body.harvestDate) await checkHarvestChange(trx, bankId, lotId, body.harvestDate, clock);
        const changes: Updateable<LotTable> = { updated_at: clock.now(), ...storageColumns(body.storage) };
        if (body.speciesId) changes.species_id = body.speciesId;
        if (body.variety !== undefined) changes.variety = body.variety;
        if (body.origin !== undefined) changes.origin = body.origin;
        if (body.sourceName !== undefined) changes.source_name = body.sourceName;
        if (body.harvestDate !== undefined) changes.harvest_date = body.harvestDate;
        if (body.packedForSeason !== undefined) changes.packed_for_season = body.packedForSeason;
        if (body.plantsBulked !== undefined) changes.plants_bulked = body.plantsBulked;
        if (body.notes !== undefined) changes.notes = body.notes;
        if (body.treated !== undefined) changes.treated = body.treated;
        if (body.status !== undefined) changes.status = body.status;
        if (body.code !== undefined) {
          await repo.lockLotCodes(trx, bankId);
          changes.code = body.code;
        }
        try {
          await repo.updateLot(trx, lotId, changes);
        } catch (error) {
          if (uniqueViolation(error))
            throw conflict(`The code ${body.code} is already used in this bank.`, 'duplicate_code');
          if ((error as { constraint?: string }).constraint === 'lots_dated') {
            throw badRequest('A lot needs a harvest date or a packed-for season.', {
              harvestDate: 'Give the harvest date or the season.',
            });
          }
          throw error;
        }
        if (body.parentPlantIds) {
          await refuseCycle(trx, bankId, lotId, body.parentPlantIds);
          await repo.setParents(trx, lotId, body.parentPlantIds);
        }
        if (body.amount) await setAmount(trx, bankId, lotId, userId, body.amount);
      });
      return get(bankId, lotId);
    },

    /** Deletes a lot outright, or retires it when it has tests (their history is kept). */
    async remove(bankId: string, lotId: string) {
      let cleanup: (() => Promise<void>) | null = null;
      const outcome = await db.transaction().execute(async (trx) => {
        const lot = await repo.lockLot(trx, bankId, lotId);
        if (!lot) throw notFound('No such lot in this bank.');
        if (await deps.hasAssays(trx, lotId)) {
          await repo.updateLot(trx, lotId, { status: 'retired', updated_at: clock.now() });
          return 'retired' as const;
        }
        cleanup = await deps.removeSubjectPhotos(trx, bankId, 'lot', lotId);
        await repo.deleteLot(trx, lotId);
        return 'deleted' as const;
      });
      // Objects go only once the rows are gone for good.
      if (cleanup) await (cleanup as () => Promise<void>)();
      return outcome;
    },

    async addMovement(bankId: string, lotId: string, userId: string, body: StockBody) {
      if (body.date > (await bankToday(db, clock, bankId))) {
        throw new AppError(422, 'impossible', 'A stock movement cannot be dated in the future.', {
          date: 'Use today or an earlier date.',
        });
      }
      return db.transaction().execute(async (trx) => moveStock(trx, bankId, lotId, userId, body));
    },

    /**
     * Writes a new lot inside the caller's transaction (offers between banks); `today` is the bank's,
     * and the day its first ledger line is dated (the day the seed came, not its harvest).
     */
    createIn: (
      trx: DbOrTx,
      bankId: string,
      userId: string,
      today: string,
      body: CreateLotBody,
      reason: string,
    ) => insertLot(trx, bankId, userId, today, body, { reason, movementDate: today }),

    moveStock,

    /**
     * Records a weighed sample of the lot and answers with its seed weight now. A weighed amount is
     * turned into seeds again with the new figure; the ledger gets the difference as a correction
     * (never taking it below zero), so seeds already taken out stay taken.
     */
    async addSeedWeight(bankId: string, lotId: string, userId: string, body: SeedWeightBody) {
      return db.transaction().execute(async (trx) => {
        const lot = await repo.lockLot(trx, bankId, lotId);
        if (!lot) throw notFound('No such lot in this bank.');
        await repo.insertSeedWeightSample(trx, {
          bank_id: bankId,
          lot_id: lotId,
          seeds: body.seeds,
          grams: body.grams,
          clean_grams: body.cleanGrams ?? null,
          created_by: userId,
        });
        const figures = (await repo.lotSeedWeightFigures(trx, bankId, lotId))!;
        if (lot.amount_kind === 'weighed' && lot.grams_entered !== null) {
          const grams = Number(lot.grams_entered);
          const weighed = weighedAmount(grams, figures.sources)!;
          const sum = await repo.ledgerSum(trx, lotId);
          const change = Math.max(weighed.seeds - (lot.weighed_seeds ?? 0), -sum);
          if (change !== 0) {
            await repo.insertMovement(trx, {
              lot_id: lotId,
              kind: 'correction',
              change,
              date: await bankToday(trx, clock, bankId),
              reason: `Re-estimated from ${grams} g at ${weighedAmountWords(weighed)}`,
              created_by: userId,
            });
          }
          await repo.updateLot(trx, lotId, { weighed_seeds: weighed.seeds, updated_at: clock.now() });
          await followStock(trx, lotId, lot.status, sum + change);
        } else {
          await repo.updateLot(trx, lotId, { updated_at: clock.now() });
        }
        return figures.seedWeight!;
      });
    },

    async movements(bankId: string, lotId: string) {
      const lot = await get(bankId, lotId);
      const rows = await repo.movementsOf(db, lotId);
      // Balances mean something from the line that made the amount known (the first 'initial'):
      // before it, and throughout while the amount is not known, they are not known either.
      const firstInitial = rows.findIndex((m) => m.kind === 'initial');
      const knownFrom = lot.amount.kind === 'unknown' ? rows.length : Math.max(0, firstInitial);
      let sum = 0;
      return rows.map((m, i) => {
        sum += m.change;
        const balance = i >= knownFrom ? sum : null;
        return {
          id: m.id,
          kind: m.kind,
          change: m.change,
          date: m.date,
          reason: m.reason,
          by: m.by,
          balance,
          createdAt: m.created_at.toISOString(),
        };
      });
    },
  };
}

export type LotsService = ReturnType<typeof createLotsService>;
