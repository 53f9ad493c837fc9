import { queryOptions, useQuery } from '@tanstack/react-query';
import { testDetailSchema, type TestDetail } from '#shared/schemas/germination';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths, type IntervalMethod } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/tests/:testId[?interval=clopper-pearson]: trays, counts and the result. */
export function getTest(
  bankId: string,
  testId: string,
  interval: IntervalMethod,
  { signal }: { signal?: AbortSignal } = {},
): Promise<TestDetail> {
  return apiFetch(bankPaths.test(bankId, testId, interval), { schema: testDetailSchema, signal });
}

export function testQueryOptions(bankId: string, testId: string, interval: IntervalMethod = 'wilson') {
  return queryOptions({
    queryKey: bankKeys.testDetail(bankId, testId, interval),
    queryFn: ({ signal }) => getTest(bankId, testId, interval, { signal }),
  });
}

export function useTest(bankId: string, testId: string, interval: IntervalMethod = 'wilson') {
  return useQuery(testQueryOptions(bankId, testId, interval));
}
