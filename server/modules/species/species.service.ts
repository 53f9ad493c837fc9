import {
  EMPTY_TRAITS,
  speciesTraitsSchema,
  type CreateSpeciesBody,
  type SpeciesDto,
  type SpeciesTraits,
} from '#shared/schemas/species';
import type { Db, DbOrTx } from '#server/db/database';
import { badRequest, conflict, notFound } from '#server/http/errors';
import * as repo from './species.repository';

interface SpeciesRowWithOverride {
  id: string;
  bank_id: string | null;
  common_name: string;
  scientific_name: string;
  family: string | null;
  traits: unknown;
  sources: unknown;
  override: unknown;
}

function toDto(row: SpeciesRowWithOverride): SpeciesDto {
  const base = speciesTraitsSchema.parse({ ...EMPTY_TRAITS, ...(row.traits as object) });
  const override = (row.override ?? {}) as Partial<SpeciesTraits>;
  return {
    id: row.id,
    commonName: row.common_name,
    scientificName: row.scientific_name,
    family: row.family,
    reference: row.bank_id === null,
    traits: { ...base, ...override },
    sources: (row.sources ?? {}) as SpeciesDto['sources'],
    overridden: Object.keys(override),
  };
}

export async function findSpecies(db: DbOrTx, bankId: string, speciesId: string): Promise<SpeciesDto | null> {
  const row = await repo.findVisibleSpecies(db, bankId, speciesId);
  return row ? toDto(row) : null;
}

export async function listSpecies(db: DbOrTx, bankId: string): Promise<SpeciesDto[]> {
  const rows = await repo.listVisibleSpecies(db, bankId);
  return rows.map(toDto);
}

/** The species id, or a 400 naming the field: an unknown species is bad input, not a 404. */
export async function requireSpecies(db: DbOrTx, bankId: string, speciesId: string, field = 'speciesId') {
  const species = await findSpecies(db, bankId, speciesId);
  if (!species)
    throw badRequest('That species is not in the list.', { [field]: 'Choose a species from the list.' });
  return species;
}

export function createSpeciesService({ db }: { db: Db }) {
  return {
    list: (bankId: string) => listSpecies(db, bankId),

    async create(bankId: string, body: CreateSpeciesBody) {
      // The reference set already has it: one entry per species keeps one ranking and one caution.
      const known = await repo.findReferenceByName(db, body.commonName, body.scientificName);
      if (known) {
        throw conflict(
          `${known.common_name} (${known.scientific_name}) is already in Hilum's list of species: choose it there.`,
          'duplicate_species',
        );
      }
      try {
        const row = await repo.insertBankSpecies(db, {
          bank_id: bankId,
          common_name: body.commonName,
          scientific_name: body.scientificName,
          family: body.family ?? null,
          traits: JSON.stringify({ ...EMPTY_TRAITS, ...body.traits }),
        });
        return (await findSpecies(db, bankId, row.id))!;
      } catch (error) {
        if ((error as { code?: string }).code === '23505') {
          throw conflict('This bank already has a species with that name.', 'duplicate_species');
        }
        throw error;
      }
    },

    async setTraits(bankId: string, speciesId: string, traits: Partial<SpeciesTraits>) {
      const species = await findSpecies(db, bankId, speciesId);
      if (!species) throw notFound('No such species in this bank.');
      if (species.reference) {
        const existing = await repo.findOverrideTraits(db, bankId, speciesId);
        const merged = JSON.stringify({ ...((existing?.traits as object) ?? {}), ...traits });
        await repo.upsertOverrideTraits(db, bankId, speciesId, merged);
      } else {
        await repo.updateSpeciesTraits(db, speciesId, JSON.stringify({ ...species.traits, ...traits }));
      }
      return (await findSpecies(db, bankId, speciesId))!;
    },

    /** Drops the bank's own values for a reference species, back to the shipped ones. */
    async clearOverrides(bankId: string, speciesId: string) {
      await repo.deleteOverride(db, bankId, speciesId);
      const species = await findSpecies(db, bankId, speciesId);
      if (!species) throw notFound('No such species in this bank.');
      return species;
    },
  };
}

export type SpeciesService = ReturnType<typeof createSpeciesService>;
