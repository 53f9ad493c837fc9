import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpeciesDto } from '#shared/schemas/species';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, refresh, stale } from '#src/lib/bank-api';
import { replaceInList, speciesResponseSchema } from './update-species-traits';

/** DELETE /api/banks/:bankId/species/:speciesId/overrides (grower): back to the reference values. */
export async function clearSpeciesOverrides(bankId: string, speciesId: string) {
  return (
    await apiFetch(bankPaths.speciesOverrides(bankId, speciesId), {
      method: 'DELETE',
      schema: speciesResponseSchema,
    })
  ).species;
}

export function useClearSpeciesOverrides(bankId: string, speciesId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => clearSpeciesOverrides(bankId, speciesId),
    onSuccess: async (species) => {
      queryClient.setQueryData<SpeciesDto[]>(bankKeys.speciesList(bankId), (list) =>
        replaceInList(list, species),
      );
      await refresh(queryClient, stale.projections(bankId));
    },
  });
}
