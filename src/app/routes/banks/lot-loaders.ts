import type { QueryClient } from '@tanstack/react-query';
import { data, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { bankQueryOptions } from '#src/features/banks/api/get-bank';
import { lotsQueryOptions } from '#src/features/lots/api/get-lots';
import { lotQueryOptions } from '#src/features/lots/api/get-lot';
import { rankingQueryOptions } from '#src/features/lots/api/get-ranking';
import { stockQueryOptions } from '#src/features/lots/api/get-stock';
import { photosQueryOptions } from '#src/features/photos/api/get-photos';
import { plantsQueryOptions } from '#src/features/plants/api/get-plants';
import { speciesQueryOptions } from '#src/features/species/api/get-species';
import { lotViabilityQueryOptions } from '#src/features/viability/api/get-lot-viability';
import { defaultSowingDate, parseSowingDate } from '#src/lib/sowing-date';
import { isApiError } from '#src/lib/api-client';
import { todayIn } from '#src/lib/dates';

/*
 * Loaders of the lots area: each waits for what the page cannot draw without, and starts the rest
 * (stock, photos) so it arrives while the page renders. The same queryOptions as the components.
 */

function failure(error: unknown, request: Request): never {
  const url = new URL(request.url);
  if (isApiError(error) && error.status === 401)
    throw redirect(paths.signIn.getHref(url.pathname + url.search));
  if (isApiError(error) && error.status === 404) throw data(error.message, { status: 404 });
  throw error;
}

function idsOf(params: LoaderFunctionArgs['params']) {
  if (!params.bankId) throw data('No bank in the address.', { status: 404 });
  return { bankId: params.bankId, lotId: params.lotId };
}

export function lotsLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const { bankId } = idsOf(params);
    const on = parseSowingDate(new URL(request.url).searchParams.get('on'));
    try {
      const [{ bank }] = await Promise.all([
        queryClient.ensureQueryData(bankQueryOptions(bankId)),
        // The first page of all lots only tells an empty bank apart; the ranking lists them.
        queryClient.ensureInfiniteQueryData(lotsQueryOptions(bankId, {})),
      ]);
      // The ranking can take a moment on a big bank: the page shows its own loading state meanwhile.
      void queryClient.prefetchQuery(
        rankingQueryOptions(bankId, on ?? defaultSowingDate(bank.lastFrost, todayIn(bank.timeZone))),
      );
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}

/** The new-lot form and the plants page: the species to pick from and the bank's plants. */
export function speciesAndPlantsLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const { bankId } = idsOf(params);
    try {
      await Promise.all([
        queryClient.ensureQueryData(bankQueryOptions(bankId)),
        queryClient.ensureQueryData(speciesQueryOptions(bankId)),
        queryClient.ensureQueryData(plantsQueryOptions(bankId)),
      ]);
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}

export function lotLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const { bankId, lotId } = idsOf(params);
    if (!lotId) throw data('No lot in the address.', { status: 404 });
    void queryClient.prefetchQuery(stockQueryOptions(bankId, lotId));
    void queryClient.prefetchQuery(photosQueryOptions(bankId, 'lot', lotId));
    const on = parseSowingDate(new URL(request.url).searchParams.get('on'));
    try {
      const [{ bank }] = await Promise.all([
        queryClient.ensureQueryData(bankQueryOptions(bankId)),
        queryClient.ensureQueryData(lotQueryOptions(bankId, lotId)),
        queryClient.ensureQueryData(speciesQueryOptions(bankId)),
        queryClient.ensureQueryData(plantsQueryOptions(bankId)),
      ]);
      // The advice, decline and storage cards share one answer: started here, drawn as it arrives.
      void queryClient.prefetchQuery(
        lotViabilityQueryOptions(
          bankId,
          lotId,
          on ?? defaultSowingDate(bank.lastFrost, todayIn(bank.timeZone)),
        ),
      );
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}
