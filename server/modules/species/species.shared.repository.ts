// What other modules may call of the species module, inside their own transactions: a bank's
// species (reference rows with the bank's trait overrides) as DTOs. Cross-module reads go through a
// module's service or its *.shared.repository.ts, never its plain repository (tests/unit/layering).
import {
  EMPTY_TRAITS,
  speciesTraitsSchema,
  type SpeciesDto,
  type SpeciesTraits,
} from '#shared/schemas/species';
import { outcrossingOf } from '#shared/species-seed-saving';
import type { DbOrTx } from '#server/db/database';
import { badRequest } from '#server/http/errors';
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

export function toSpeciesDto(row: SpeciesRowWithOverride): SpeciesDto {
  const base = speciesTraitsSchema.parse({ ...EMPTY_TRAITS, ...(row.traits as object) });
  const override = (row.override ?? {}) as Partial<SpeciesTraits>;
  const traits = { ...base, ...override };
  // `outcrossing` is pollination seen from afar: a known pollination (a bank's own included) decides it.
  if (traits.pollination != null && override.outcrossing === undefined)
    traits.outcrossing = outcrossingOf(traits.pollination);
  return {
    id: row.id,
    commonName: row.common_name,
    scientificName: row.scientific_name,
    family: row.family,
    reference: row.bank_id === null,
    traits,
    sources: (row.sources ?? {}) as SpeciesDto['sources'],
    overridden: Object.keys(override),
  };
}

export async function findSpecies(db: DbOrTx, bankId: string, speciesId: string): Promise<SpeciesDto | null> {
  const row = await repo.findVisibleSpecies(db, bankId, speciesId);
  return row ? toSpeciesDto(row) : null;
}

export async function listSpecies(db: DbOrTx, bankId: string): Promise<SpeciesDto[]> {
  const rows = await repo.listVisibleSpecies(db, bankId);
  return rows.map(toSpeciesDto);
}

/** The species id, or a 400 naming the field: an unknown species is bad input, not a 404. */
export async function requireSpecies(db: DbOrTx, bankId: string, speciesId: string, field = 'speciesId') {
  const species = await findSpecies(db, bankId, speciesId);
  if (!species)
    throw badRequest('That species is not in the list.', { [field]: 'Choose a species from the list.' });
  return species;
}
