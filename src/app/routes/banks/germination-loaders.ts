import type { QueryClient } from '@tanstack/react-query';
import { data, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { assayQueryOptions } from '#src/features/germination/api/get-assay';
import { lotQueryOptions } from '#src/features/lots/api/get-lot';
import { isApiError } from '#src/lib/api-client';

/** `?interval=exact` on the test page asks for the Clopper–Pearson interval. */
export const EXACT_INTERVAL_PARAM = 'interval';
/** `?date=YYYY-MM-DD`: the check date being entered, so a reload at the bench keeps it. */
export const CHECK_DATE_PARAM = 'date';
export const intervalFromSearch = (search: URLSearchParams) =>
  search.get(EXACT_INTERVAL_PARAM) === 'exact' ? ('clopper-pearson' as const) : ('wilson' as const);

function failure(error: unknown, request: Request): never {
  const url = new URL(request.url);
  if (isApiError(error) && error.status === 401)
    throw redirect(paths.signIn.getHref(url.pathname + url.search));
  if (isApiError(error) && error.status === 404) throw data(error.message, { status: 404 });
  throw error;
}

function param(params: LoaderFunctionArgs['params'], name: string): string {
  const value = params[name];
  if (!value) throw data(`No ${name} in the address.`, { status: 404 });
  return value;
}

/** /banks/:bankId/tests/:testId: the test with the interval the address asks for. */
export function assayLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const interval = intervalFromSearch(new URL(request.url).searchParams);
    try {
      await queryClient.ensureQueryData(
        assayQueryOptions(param(params, 'bankId'), param(params, 'testId'), interval),
      );
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}

/** /banks/:bankId/lots/:lotId/tests/new: the lot, for its stock on hand. */
export function newAssayLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    try {
      await queryClient.ensureQueryData(lotQueryOptions(param(params, 'bankId'), param(params, 'lotId')));
    } catch (error) {
      failure(error, request);
    }
    return null;
  };
}
