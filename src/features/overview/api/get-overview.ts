import { queryOptions, useQuery } from '@tanstack/react-query';
import { overviewSchema } from '#shared/schemas/overview';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/overview[?on=YYYY-MM-DD]: what needs doing in the week from that day. */
export function getOverview(bankId: string, on?: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiFetch(bankPaths.overview(bankId, on), { schema: overviewSchema, signal });
}

export function overviewQueryOptions(bankId: string, on?: string) {
  return queryOptions({
    queryKey: bankKeys.overview(bankId, on),
    queryFn: ({ signal }) => getOverview(bankId, on, { signal }),
    // Counts and sowings change on other pages; coming back here should show them at once.
    staleTime: 0,
  });
}

export function useOverview(bankId: string, on?: string) {
  return useQuery(overviewQueryOptions(bankId, on));
}
