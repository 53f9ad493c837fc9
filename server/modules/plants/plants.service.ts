import type { z } from 'zod';
import type { createPlantBodySchema, updatePlantBodySchema } from '#shared/schemas/lots';
import type { Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { ParentPlantTable } from '#server/db/schema';
import { notFound } from '#server/http/errors';
import { listSpecies, requireSpecies } from '../species/species.shared.repository';
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
      };
    });
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
      const row = await repo.insertPlant(db, {
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
      await get(bankId, plantId);
      if (body.speciesId) await requireSpecies(db, bankId, body.speciesId);
      const changes: Updateable<ParentPlantTable> = { updated_at: clock.now() };
      if (body.speciesId !== undefined) changes.species_id = body.speciesId;
      if (body.label !== undefined) changes.label = body.label;
      if (body.variety !== undefined) changes.variety = body.variety;
      if (body.location !== undefined) changes.location = body.location;
      if (body.season !== undefined) changes.season = body.season;
      if (body.hybrid !== undefined) changes.hybrid = body.hybrid;
      if (body.notes !== undefined) changes.notes = body.notes;
      await repo.updatePlant(db, plantId, changes);
      return get(bankId, plantId);
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
