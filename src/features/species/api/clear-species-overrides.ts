import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SpeciesDto } from '../../../../shared/schemas/species';
import { apiFetch } from '../../../lib/api-client';
import { speciesApiPaths, speciesKeys } from './keys';
import { replaceInList, speciesResponseSchema } from './update-species-traits';

/** DELETE /api/banks/:bankId/species/:speciesId/overrides (grower): back to the reference values. */
export async function clearSpeciesOverrides(bankId: string, speciesId: string) {
  return (
    await apiFetch(speciesApiPaths.overrides(bankId, speciesId), { method: 'DELETE', schema: speciesResponseSchema })
  ).species;
}

export function useClearSpeciesOverrides(bankId: string, speciesId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => clearSpeciesOverrides(bankId, speciesId),
    onSuccess: (species) => {
      queryClient.setQueryData<SpeciesDto[]>(speciesKeys.list(bankId), (list) => replaceInList(list, species));
    },
  });
}
