import { queryOptions, useQuery } from '@tanstack/react-query';
import { speciesListResponseSchema } from '#shared/schemas/species';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/species: the reference set plus the bank's own species. */
export async function getSpecies(bankId: string, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(bankPaths.species(bankId), { schema: speciesListResponseSchema, signal })).items;
}

export function speciesQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.speciesList(bankId),
    queryFn: ({ signal }) => getSpecies(bankId, { signal }),
    // The reference set changes with a release, not during a session.
    staleTime: 5 * 60_000,
  });
}

export function useSpecies(bankId: string) {
  return useQuery(speciesQueryOptions(bankId));
}
