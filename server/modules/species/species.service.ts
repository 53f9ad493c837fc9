import { EMPTY_TRAITS, type CreateSpeciesBody, type SpeciesTraits } from '#shared/schemas/species';
import type { Db } from '#server/db/database';
import { conflict, notFound } from '#server/http/errors';
import * as repo from './species.repository';
import { findSpecies, listSpecies } from './species.shared.repository';

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
