import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSpeciesBody, SpeciesDto } from '#shared/schemas/species';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';
import { speciesResponseSchema } from './update-species-traits';

/** POST /api/banks/:bankId/species (grower): a species of this bank's own, beside the reference set. */
export async function createSpecies(bankId: string, body: CreateSpeciesBody) {
  return (await apiFetch(bankPaths.species(bankId), { method: 'POST', body, schema: speciesResponseSchema }))
    .species;
}

export function useCreateSpecies(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateSpeciesBody) => createSpecies(bankId, body),
    onSuccess: (species) => {
      // Into the cached list at once, so the picker can choose it before any refetch.
      queryClient.setQueryData<SpeciesDto[]>(bankKeys.speciesList(bankId), (list) =>
        list ? [...list, species].sort((a, b) => a.commonName.localeCompare(b.commonName)) : list,
      );
      void queryClient.invalidateQueries({ queryKey: bankKeys.species(bankId) });
    },
  });
}
