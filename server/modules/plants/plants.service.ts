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
import { listSpecies, requireSpecies } from '../species/species.shared.repository';
import {
  findBankLot,
  lineageCycle,
  lockLineage,
  lotsOfParents,
  makesCycle,
} from '../lots/lots.shared.repository';
import { findPlanEntry } from '../plan/plan.shared.repository';
import { plantCautions } from './plant-cautions';
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
      };
    });
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
