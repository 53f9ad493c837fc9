import {
  EMPTY_TRAITS,
  speciesTraitsSchema,
  type CreateSpeciesBody,
  type SpeciesDto,
  type SpeciesTraits,
} from '../../../shared/schemas/species';
import type { Db, DbOrTx } from '../../db/database';
import { badRequest, conflict, notFound } from '../../http/errors';

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

/** Reference species and the bank's own, with the bank's overrides merged in. */
function visibleSpecies(db: DbOrTx, bankId: string) {
  return db
    .selectFrom('species')
    .leftJoin('species_overrides', (join) =>
      join.onRef('species_overrides.species_id', '=', 'species.id').on('species_overrides.bank_id', '=', bankId),
    )
    .select([
      'species.id',
      'species.bank_id',
      'species.common_name',
      'species.scientific_name',
      'species.family',
      'species.traits',
      'species.sources',
      'species_overrides.traits as override',
    ])
    .where((eb) => eb.or([eb('species.bank_id', 'is', null), eb('species.bank_id', '=', bankId)]));
}

export async function findSpecies(db: DbOrTx, bankId: string, speciesId: string): Promise<SpeciesDto | null> {
  const row = await visibleSpecies(db, bankId).where('species.id', '=', speciesId).executeTakeFirst();
  return row ? toDto(row) : null;
}

export async function listSpecies(db: DbOrTx, bankId: string): Promise<SpeciesDto[]> {
  const rows = await visibleSpecies(db, bankId).orderBy('species.common_name').execute();
  return rows.map(toDto);
}

/** The species id, or a 400 naming the field: an unknown species is bad input, not a 404. */
export async function requireSpecies(db: DbOrTx, bankId: string, speciesId: string, field = 'speciesId') {
  const species = await findSpecies(db, bankId, speciesId);
  if (!species) throw badRequest('That species is not in the list.', { [field]: 'Choose a species from the list.' });
  return species;
}

export function createSpeciesService({ db }: { db: Db }) {
  return {
    list: (bankId: string) => listSpecies(db, bankId),

    async create(bankId: string, body: CreateSpeciesBody) {
      // The reference set already has it: one entry per species keeps one ranking and one caution.
      const known = await db
        .selectFrom('species')
        .select(['common_name', 'scientific_name'])
        .where('bank_id', 'is', null)
        .where((eb) =>
          eb.or([
            eb(eb.fn('lower', ['common_name']), '=', body.commonName.toLowerCase()),
            eb(eb.fn('lower', ['scientific_name']), '=', body.scientificName.toLowerCase()),
          ]),
        )
        .executeTakeFirst();
      if (known) {
        throw conflict(`${known.common_name} (${known.scientific_name}) is already in Hilum's list of species: choose it there.`, 'duplicate_species');
      }
      try {
        const row = await db
          .insertInto('species')
          .values({
            bank_id: bankId,
            common_name: body.commonName,
            scientific_name: body.scientificName,
            family: body.family ?? null,
            traits: JSON.stringify({ ...EMPTY_TRAITS, ...body.traits }),
          })
          .returning('id')
          .executeTakeFirstOrThrow();
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
        const existing = await db
          .selectFrom('species_overrides')
          .select('traits')
          .where('bank_id', '=', bankId)
          .where('species_id', '=', speciesId)
          .executeTakeFirst();
        const merged = JSON.stringify({ ...((existing?.traits as object) ?? {}), ...traits });
        await db
          .insertInto('species_overrides')
          .values({ bank_id: bankId, species_id: speciesId, traits: merged })
          .onConflict((oc) => oc.columns(['bank_id', 'species_id']).doUpdateSet({ traits: merged, updated_at: new Date() }))
          .execute();
      } else {
        await db
          .updateTable('species')
          .set({ traits: JSON.stringify({ ...species.traits, ...traits }), updated_at: new Date() })
          .where('id', '=', speciesId)
          .execute();
      }
      return (await findSpecies(db, bankId, speciesId))!;
    },

    /** Drops the bank's own values for a reference species, back to the shipped ones. */
    async clearOverrides(bankId: string, speciesId: string) {
      await db.deleteFrom('species_overrides').where('bank_id', '=', bankId).where('species_id', '=', speciesId).execute();
      const species = await findSpecies(db, bankId, speciesId);
      if (!species) throw notFound('No such species in this bank.');
      return species;
    },
  };
}

export type SpeciesService = ReturnType<typeof createSpeciesService>;
