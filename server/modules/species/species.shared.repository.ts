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
import { sql } from 'kysely';
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

/**
 * The receiving bank's species for seed coming from another bank. A reference species is the same
 * in every bank. A species the giving bank added itself is found in the receiving bank's own list by
 * its names (the names its unique index compares), else copied there with its traits and sources;
 * two accepts at once make one copy.
 */
export async function adoptSpecies(db: DbOrTx, speciesId: string, bankId: string): Promise<string> {
  const from = await db
    .selectFrom('species')
    .select(['id', 'bank_id', 'common_name', 'scientific_name', 'family', 'traits', 'sources'])
    .where('id', '=', speciesId)
    .executeTakeFirstOrThrow();
  if (from.bank_id === null || from.bank_id === bankId) return from.id;
  const sameNames = () =>
    db
      .selectFrom('species')
      .select('id')
      .where('bank_id', '=', bankId)
      .where(sql`lower(common_name)`, '=', from.common_name.toLowerCase())
      .where(sql`lower(scientific_name)`, '=', from.scientific_name.toLowerCase())
      .executeTakeFirst();
  const found = await sameNames();
  if (found) return found.id;
  await sql`
    insert into species (bank_id, common_name, scientific_name, family, traits, sources)
    values (${bankId}, ${from.common_name}, ${from.scientific_name}, ${from.family},
            ${JSON.stringify(from.traits)}::jsonb, ${JSON.stringify(from.sources ?? {})}::jsonb)
    on conflict (bank_id, lower(common_name), lower(scientific_name)) where bank_id is not null
    do nothing`.execute(db);
  return (await sameNames())!.id;
}
