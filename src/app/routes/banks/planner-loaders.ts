import type { QueryClient } from '@tanstack/react-query';
import { data, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { bankQueryOptions } from '#src/features/banks/api/get-bank';
import { planQueryOptions } from '#src/features/planner/api/get-plan';
import { rankingQueryOptions } from '#src/features/planner/api/get-ranking';
import { comingSeason } from '#shared/plan-dates';
import { remindersQueryOptions } from '#src/features/reminders/api/get-reminders';
import { speciesQueryOptions } from '#src/features/species/api/get-species';
import { isApiError } from '#src/lib/api-client';
import { todayIn } from '#src/lib/dates';

/** `?season=2027` picks the season; without it, the coming spring. */
export const SEASON_PARAM = 'season';

export function seasonFromSearch(search: URLSearchParams, today: string): number {
  const raw = Number(search.get(SEASON_PARAM));
  return Number.isInteger(raw) && raw >= 1900 && raw <= 2100 ? raw : comingSeason(today);
}

function failure(error: unknown, request: Request): never {
  const url = new URL(request.url);
  if (isApiError(error) && error.status === 401)
    throw redirect(paths.signIn.getHref(url.pathname + url.search));
  if (isApiError(error) && error.status === 404) throw data(error.message, { status: 404 });
  throw error;
}

function bankIdOf(params: LoaderFunctionArgs['params']): string {
  if (!params.bankId) throw data('No bank in the address.', { status: 404 });
  return params.bankId;
}

/** /banks/:bankId/planner: the bank (for its frost date and "today"), the season's entries, the species. */
export function plannerLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const bankId = bankIdOf(params);
    try {
      const { bank } = await queryClient.ensureQueryData(bankQueryOptions(bankId));
      const today = todayIn(bank.timeZone);
      const season = seasonFromSearch(new URL(request.url).searchParams, today);
      // The retest dates of the calendar arrive while the page draws.
      void queryClient.prefetchQuery(rankingQueryOptions(bankId, today));
      await Promise.all([
        queryClient.ensureQueryData(planQueryOptions(bankId, season)),
        queryClient.ensureQueryData(speciesQueryOptions(bankId)),
      ]);
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}

/** /banks/:bankId/reminders: the signed-in member's choices in that bank. */
export function remindersLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const bankId = bankIdOf(params);
    try {
      await Promise.all([
        queryClient.ensureQueryData(bankQueryOptions(bankId)),
        queryClient.ensureQueryData(remindersQueryOptions(bankId)),
      ]);
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}
