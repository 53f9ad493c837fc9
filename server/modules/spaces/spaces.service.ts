import type { PlanEntryDto } from '#shared/schemas/plan';
import type {
  CreateSpaceBody,
  GrowingSpaceDto,
  SpacePlanDto,
  SpaceUnit,
  UpdateSpaceBody,
} from '#shared/schemas/spaces';
import { CELLS_PER_TRAY } from '#shared/species-space';
import type { Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { conflict, notFound } from '#server/http/errors';
import { listSpecies } from '../species/species.shared.repository';
import { entrySpace, weeklySpace } from './space-use';
import * as repo from './spaces.repository';

export interface SpacesServiceDeps {
  db: Db;
  clock: Clock;
  /**
   * The season's plan entries with their live dates: the plan service's `list`, the one way this
   * module reads the plan (its dates follow the frost date and successions however the plan
   * module works them out).
   */
  listPlan: (bankId: string, season: number) => Promise<PlanEntryDto[]>;
}

const cellsOf = (capacity: number, unit: SpaceUnit) =>
  unit === 'trays' ? capacity * CELLS_PER_TRAY : capacity;

const toDto = (r: repo.SpaceRow): GrowingSpaceDto => ({
  id: r.id,
  name: r.name,
  capacity: r.capacity,
  unit: r.unit,
  cells: cellsOf(r.capacity, r.unit),
});

const duplicateName = (error: unknown) => {
  if ((error as { code?: string }).code === '23505')
    return conflict('This bank already has a space with that name.', 'duplicate_space');
  return error;
};

export function createSpacesService({ db, clock, listPlan }: SpacesServiceDeps) {
  async function get(bankId: string, spaceId: string) {
    const row = await repo.findSpace(db, bankId, spaceId);
    if (!row) throw notFound('No such growing space in this bank.');
    return toDto(row);
  }
  async function list(bankId: string) {
    return (await repo.listSpaces(db, bankId)).map(toDto);
  }

  return {
    get,
    list,

    async create(bankId: string, body: CreateSpaceBody) {
      try {
        const row = await repo.insertSpace(db, { bank_id: bankId, ...body });
        return await get(bankId, row.id);
      } catch (error) {
        throw duplicateName(error);
      }
    },

    async update(bankId: string, spaceId: string, body: UpdateSpaceBody) {
      await get(bankId, spaceId);
      try {
        await repo.updateSpace(db, bankId, spaceId, { ...body, updated_at: clock.now() });
      } catch (error) {
        throw duplicateName(error);
      }
      return get(bankId, spaceId);
    },

    async remove(bankId: string, spaceId: string) {
      const deleted = await repo.deleteSpace(db, bankId, spaceId);
      if (!deleted.numDeletedRows) throw notFound('No such growing space in this bank.');
    },

    /** The season's room under the lights, week by week, against the bank's spaces (all in cells). */
    async seasonSpace(bankId: string, season: number): Promise<SpacePlanDto> {
      const [spaces, entries, species] = await Promise.all([
        list(bankId),
        listPlan(bankId, season),
        listSpecies(db, bankId),
      ]);
      const traits = new Map(species.map((s) => [s.id, s.traits]));
      const uses = entries.flatMap((e) => entrySpace(e, traits.get(e.speciesId)) ?? []);
      const capacity = spaces.reduce((sum, s) => sum + s.cells, 0);
      return {
        season,
        unit: 'cells',
        cellsPerTray: CELLS_PER_TRAY,
        weekStartsOn: 'monday',
        spaces,
        weeks: weeklySpace(uses, capacity),
        entries: uses,
      };
    },
  };
}

export type SpacesService = ReturnType<typeof createSpacesService>;
