import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { speciesSchema, type SpeciesDto, type SpeciesTraits } from '#shared/schemas/species';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';

export const speciesResponseSchema = z.object({ species: speciesSchema });

/** PATCH /api/banks/:bankId/species/:speciesId (grower): this bank's own values over the reference. */
export async function updateSpeciesTraits(bankId: string, speciesId: string, traits: Partial<SpeciesTraits>) {
  return (
    await apiFetch(bankPaths.speciesOne(bankId, speciesId), {
      method: 'PATCH',
      body: { traits },
      schema: speciesResponseSchema,
    })
  ).species;
}

/** Puts one changed species into the cached list, so every picker and card sees it at once. */
export function replaceInList(list: SpeciesDto[] | undefined, species: SpeciesDto) {
  return list?.map((s) => (s.id === species.id ? species : s));
}

export function useUpdateSpeciesTraits(bankId: string, speciesId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (traits: Partial<SpeciesTraits>) => updateSpeciesTraits(bankId, speciesId, traits),
    // Storage and timing traits feed every lot's decline, the ranking, the plan and the overview.
    onSuccess: async (species) => {
      queryClient.setQueryData<SpeciesDto[]>(bankKeys.speciesList(bankId), (list) =>
        replaceInList(list, species),
      );
      await refresh(queryClient, stale.projections(bankId));
    },
  });
}
