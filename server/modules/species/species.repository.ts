import type { DbOrTx } from '#server/db/database';

/** Reference species and the bank's own, with the bank's overrides beside them. */
function visibleSpecies(db: DbOrTx, bankId: string) {
  return db
    .selectFrom('species')
    .leftJoin('species_overrides', (join) =>
      join
        .onRef('species_overrides.species_id', '=', 'species.id')
        .on('species_overrides.bank_id', '=', bankId),
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

export const findVisibleSpecies = (db: DbOrTx, bankId: string, speciesId: string) =>
  visibleSpecies(db, bankId).where('species.id', '=', speciesId).executeTakeFirst();

export const listVisibleSpecies = (db: DbOrTx, bankId: string) =>
  visibleSpecies(db, bankId).orderBy('species.common_name').execute();

/** A reference species with this common or scientific name, case-insensitively. */
export const findReferenceByName = (db: DbOrTx, commonName: string, scientificName: string) =>
  db
    .selectFrom('species')
    .select(['common_name', 'scientific_name'])
    .where('bank_id', 'is', null)
    .where((eb) =>
      eb.or([
        eb(eb.fn('lower', ['common_name']), '=', commonName.toLowerCase()),
        eb(eb.fn('lower', ['scientific_name']), '=', scientificName.toLowerCase()),
      ]),
    )
    .executeTakeFirst();

export const insertBankSpecies = (
  db: DbOrTx,
  values: {
    bank_id: string;
    common_name: string;
    scientific_name: string;
    family: string | null;
    traits: string;
  },
) => db.insertInto('species').values(values).returning('id').executeTakeFirstOrThrow();

export const findOverrideTraits = (db: DbOrTx, bankId: string, speciesId: string) =>
  db
    .selectFrom('species_overrides')
    .select('traits')
    .where('bank_id', '=', bankId)
    .where('species_id', '=', speciesId)
    .executeTakeFirst();

export const upsertOverrideTraits = (db: DbOrTx, bankId: string, speciesId: string, traits: string) =>
  db
    .insertInto('species_overrides')
    .values({ bank_id: bankId, species_id: speciesId, traits })
    .onConflict((oc) => oc.columns(['bank_id', 'species_id']).doUpdateSet({ traits, updated_at: new Date() }))
    .execute();

export const updateSpeciesTraits = (db: DbOrTx, speciesId: string, traits: string) =>
  db.updateTable('species').set({ traits, updated_at: new Date() }).where('id', '=', speciesId).execute();

export const deleteOverride = (db: DbOrTx, bankId: string, speciesId: string) =>
  db
    .deleteFrom('species_overrides')
    .where('bank_id', '=', bankId)
    .where('species_id', '=', speciesId)
    .execute();

/** Inserts a shipped reference species, or updates it by its key. */
export const upsertReferenceSpecies = (
  db: DbOrTx,
  values: {
    ref_key: string;
    common_name: string;
    scientific_name: string;
    family: string | null;
    traits: string;
    sources: string;
  },
) =>
  db
    .insertInto('species')
    .values(values)
    .onConflict((oc) =>
      oc.column('ref_key').doUpdateSet({
        common_name: values.common_name,
        scientific_name: values.scientific_name,
        family: values.family,
        traits: values.traits,
        sources: values.sources,
        updated_at: new Date(),
      }),
    )
    .execute();
