import type { z } from 'zod';
import type {
  createPlantBodySchema,
  PlantsFromSowingBody,
  updatePlantBodySchema,
} from '#shared/schemas/lots';
import type { Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { ParentPlantTable } from '#server/db/schema';
import { notFound, unprocessable } from '#server/http/errors';
import { findSpecies, listSpecies, requireSpecies } from '../species/species.shared.repository';
import {
  findBankLot,
  lineageCycle,
  lockLineage,
  lotsOfParents,
  makesCycle,
} from '../lots/lots.shared.repository';
import { findPlanEntry } from '../plan/plan.shared.repository';
import { plantCautions } from './plant-cautions';
import type { Isolation, SeedSavingWarning } from '#shared/schemas/seed-saving';
import {
  isolationWarnings,
  populationWarning,
  varietyKey,
  type KeptPlant,
  type SpeciesForWarnings,
} from './keeping-true';
import * as repo from './plants.repository';
import type { Updateable } from 'kysely';
import type { PhotoDto } from '#shared/schemas/lots';

type CreatePlant = z.infer<typeof createPlantBodySchema>;
type UpdatePlant = z.infer<typeof updatePlantBodySchema>;

export interface PlantsServiceDeps {
  db: Db;
  clock: Clock;
  photosOf: (db: DbOrTx, subject: 'plant', subjectIds: string[]) => Promise<Map<string, PhotoDto[]>>;
  removeSubjectPhotos: (
    db: DbOrTx,
    bankId: string,
    subject: 'plant',
    subjectId: string,
  ) => Promise<() => Promise<void>>;
}

export function createPlantsService({ db, clock, photosOf, removeSubjectPhotos }: PlantsServiceDeps) {
  async function dtos(bankId: string, rows: repo.PlantRow[]) {
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
    const photos = await photosOf(
      db,
      'plant',
      rows.map((r) => r.id),
    );
    const kept = await keepingTrueInputs(bankId);
    return rows.map((r) => {
      const sp = species.get(r.species_id);
      return {
        id: r.id,
        speciesId: r.species_id,
        speciesName: sp?.commonName ?? '',
        label: r.label,
        variety: r.variety,
        location: r.location,
        season: r.season,
        hybrid: r.hybrid,
        notes: r.notes,
        photos: photos.get(r.id) ?? [],
        cautions: sp ? plantCautions(r.hybrid, sp.traits) : [],
        grownFromLotId: r.grown_from_lot_id,
        grownFromLotCode: r.grown_from_code,
        // Keeping a variety true.
        isolation: isolationOf(r),
        warnings: sp ? plantWarnings(keptPlant(r), kept, sp) : [],
      };
    });
  }

  /** The bank's parent plants and the plants each one's lots were saved from, for the warnings. */
  async function keepingTrueInputs(bankId: string) {
    const [plants, lots] = await Promise.all([
      repo.listPlants(db, bankId),
      repo.lotPopulationsOfPlants(db, bankId),
    ]);
    const populations = new Map<string, number>();
    for (const l of lots) {
      const n = Number(l.plants);
      populations.set(l.parent_plant_id, Math.max(n, populations.get(l.parent_plant_id) ?? 0));
    }
    return { plants: plants.map(keptPlant), populations };
  }

  /**
   * Generations: the lot a plant grew from is a lot of this bank, of the plant's species, and (for a
   * plant already a parent of lots) not one of those lots nor a lot saved from them.
   */
  async function checkGrownFrom(
    trx: DbOrTx,
    bankId: string,
    lotId: string,
    speciesId: string,
    plantId: string | null,
  ) {
    const lot = await findBankLot(trx, bankId, lotId);
    if (!lot) {
      throw unprocessable('The lot the plant grew from is not a lot of this bank.', {
        grownFromLotId: 'Choose a lot of this bank.',
      });
    }
    if (lot.species_id !== speciesId) {
      throw unprocessable(`Lot ${lot.code} is of another species than this plant.`, {
        grownFromLotId: `Choose a lot of the plant's species.`,
      });
    }
    if (plantId !== null) {
      await lockLineage(trx, bankId);
      if (await makesCycle(trx, bankId, await lotsOfParents(trx, [plantId]), lotId)) {
        throw lineageCycle('grownFromLotId');
      }
    }
    return lot;
  }

  async function get(bankId: string, plantId: string) {
    const row = await repo.findPlant(db, bankId, plantId);
    if (!row) throw notFound('No such parent plant in this bank.');
    return (await dtos(bankId, [row]))[0]!;
  }

  return {
    get,
    async list(bankId: string) {
      return dtos(bankId, await repo.listPlants(db, bankId));
    },
    async create(bankId: string, body: CreatePlant) {
      await requireSpecies(db, bankId, body.speciesId);
      if (body.grownFromLotId) await checkGrownFrom(db, bankId, body.grownFromLotId, body.speciesId, null);
      const row = await repo.insertPlant(db, {
        grown_from_lot_id: body.grownFromLotId ?? null,
        bank_id: bankId,
        species_id: body.speciesId,
        label: body.label,
        variety: body.variety ?? null,
        location: body.location ?? null,
        season: body.season ?? null,
        hybrid: body.hybrid ?? false,
        notes: body.notes ?? null,
        ...isolationColumns(body.isolation ?? null),
      });
      return get(bankId, row.id);
    },
    async update(bankId: string, plantId: string, body: UpdatePlant) {
      const before = await get(bankId, plantId);
      if (body.speciesId) await requireSpecies(db, bankId, body.speciesId);
      const changes: Updateable<ParentPlantTable> = { updated_at: clock.now() };
      if (body.speciesId !== undefined) changes.species_id = body.speciesId;
      if (body.label !== undefined) changes.label = body.label;
      if (body.variety !== undefined) changes.variety = body.variety;
      if (body.location !== undefined) changes.location = body.location;
      if (body.season !== undefined) changes.season = body.season;
      if (body.hybrid !== undefined) changes.hybrid = body.hybrid;
      if (body.notes !== undefined) changes.notes = body.notes;
      if (body.isolation !== undefined) Object.assign(changes, isolationColumns(body.isolation));
      if (body.grownFromLotId !== undefined) changes.grown_from_lot_id = body.grownFromLotId;
      const grownFrom = body.grownFromLotId === undefined ? before.grownFromLotId : body.grownFromLotId;
      await db.transaction().execute(async (trx) => {
        if (grownFrom && (body.grownFromLotId || body.speciesId)) {
          await checkGrownFrom(trx, bankId, grownFrom, body.speciesId ?? before.speciesId, plantId);
        }
        await repo.updatePlant(trx, plantId, changes);
      });
      return get(bankId, plantId);
    },

    /**
     * Generations: the plants kept for seed from a sown plan entry, grown from its lot, one parent
     * plant each (numbered), in one transaction.
     */
    async createFromSowing(bankId: string, body: PlantsFromSowingBody) {
      const entry = await findPlanEntry(db, bankId, body.entryId);
      if (!entry) throw notFound('No such plan entry in this bank.');
      if (!entry.sown_on) {
        throw unprocessable('This sowing is not marked sown yet.', {
          entryId: 'Mark the sowing sown first: plants grow from a sowing that was made.',
        });
      }
      if (!entry.lot_id || !entry.lot_code) {
        throw unprocessable('This sowing names no lot, so its plants grew from no lot of this bank.', {
          entryId: 'Choose the lot it was sown from, or add the plants on the parent plants page.',
        });
      }
      const label = body.label ?? `From ${entry.lot_code}`;
      const width = String(body.plants).length;
      const ids = await db.transaction().execute(async (trx) => {
        const lot = await checkGrownFrom(trx, bankId, entry.lot_id!, entry.species_id, null);
        return repo.insertPlants(
          trx,
          Array.from({ length: body.plants }, (_, i) => ({
            bank_id: bankId,
            species_id: entry.species_id,
            label:
              body.plants === 1
                ? label
                : `${label}, plant ${String(i + 1).padStart(width, '0')} of ${body.plants}`,
            variety: lot.variety,
            location: body.location ?? null,
            season: entry.season,
            hybrid: body.hybrid ?? false,
            notes: null,
            grown_from_lot_id: entry.lot_id,
          })),
        );
      });
      const wanted = new Set(ids.map((r) => r.id));
      return dtos(
        bankId,
        (await repo.listPlants(db, bankId))
          .filter((r) => wanted.has(r.id))
          .sort((a, b) => a.label.localeCompare(b.label)),
      );
    },
    /** A lot's population and isolation, with the warnings on them (the lot page's card). */
    async keepingTrue(bankId: string, lotId: string) {
      const lot = await repo.lotForKeepingTrue(db, bankId, lotId);
      if (!lot) throw notFound('No such lot in this bank.');
      const species = await findSpecies(db, bankId, lot.species_id);
      if (!species) throw notFound('No such lot in this bank.');
      const kept = await keepingTrueInputs(bankId);
      const parents = kept.plants.filter((p) => lot.parent_plant_ids.includes(p.id));
      const plantsSavedFrom = lot.plants_bulked ?? (parents.length > 0 ? parents.length : null);
      const population = populationWarning(species, plantsSavedFrom);
      const isolation = parents.flatMap((p) => isolationWarnings(p, kept.plants, species));
      return {
        lotId: lot.id,
        speciesName: species.commonName,
        pollination: species.traits.pollination ?? null,
        isolationMeters: species.traits.isolationMeters ?? null,
        minPlantsForSeed: species.traits.minPlantsForSeed ?? null,
        plantsSavedFrom,
        parentPlants: parents.length,
        warnings: [
          ...(population ? [population] : []),
          ...isolation.filter((w, i) => isolation.findIndex((x) => x.message === w.message) === i),
        ],
      };
    },
    async remove(bankId: string, plantId: string) {
      await get(bankId, plantId);
      const cleanup = await db.transaction().execute(async (trx) => {
        const done = await removeSubjectPhotos(trx, bankId, 'plant', plantId);
        await repo.deletePlant(trx, plantId);
        return done;
      });
      await cleanup();
    },
  };
}

export type PlantsService = ReturnType<typeof createPlantsService>;

// ---- Keeping a variety true -------------------------------------------------------------------

function isolationOf(r: Pick<repo.PlantRow, 'isolation_method' | 'isolation_meters'>): Isolation | null {
  if (r.isolation_method === null) return null;
  if (r.isolation_method === 'distance') return { method: 'distance', meters: Number(r.isolation_meters) };
  return { method: r.isolation_method };
}

const isolationColumns = (i: Isolation | null) => ({
  isolation_method: i?.method ?? null,
  isolation_meters: i?.method === 'distance' ? i.meters : null,
});

const keptPlant = (r: repo.PlantRow): KeptPlant => ({
  id: r.id,
  speciesId: r.species_id,
  label: r.label,
  variety: r.variety,
  season: r.season,
  isolation: isolationOf(r),
});

const sameGroup = (a: KeptPlant, b: KeptPlant) =>
  a.speciesId === b.speciesId && a.season === b.season && varietyKey(a.variety) === varietyKey(b.variety);

/**
 * A parent plant's warnings. The plants its seed was saved from: the most of any lot it is a parent
 * of (plants bulked, else the lot's parent plants); for a plant in no lot yet, the bank's parent
 * plants of its species, variety and season (the plants saved from together).
 */
function plantWarnings(
  plant: KeptPlant,
  kept: { plants: KeptPlant[]; populations: Map<string, number> },
  species: SpeciesForWarnings,
): SeedSavingWarning[] {
  const savedFrom = kept.populations.get(plant.id) ?? kept.plants.filter((p) => sameGroup(p, plant)).length;
  const population = populationWarning(species, savedFrom);
  return [...(population ? [population] : []), ...isolationWarnings(plant, kept.plants, species)];
}
