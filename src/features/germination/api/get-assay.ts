import { queryOptions, useQuery } from '@tanstack/react-query';
import { assayDetailSchema, type AssayDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, type IntervalMethod } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/tests/:testId[?interval=clopper-pearson]: trays, counts and the result. */
export function getAssay(
  bankId: string,
  assayId: string,
  interval: IntervalMethod,
  { signal }: { signal?: AbortSignal } = {},
): Promise<AssayDetail> {
  return apiFetch(bankPaths.assay(bankId, assayId, interval), { schema: assayDetailSchema, signal });
}

export function assayQueryOptions(bankId: string, assayId: string, interval: IntervalMethod = 'wilson') {
  return queryOptions({
    queryKey: bankKeys.assayDetail(bankId, assayId, interval),
    queryFn: ({ signal }) => getAssay(bankId, assayId, interval, { signal }),
  });
}

export function useAssay(bankId: string, assayId: string, interval: IntervalMethod = 'wilson') {
  return useQuery(assayQueryOptions(bankId, assayId, interval));
}
