import type { QueryClient } from '@tanstack/react-query';
import { data, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '#src/config/paths';
import { bankQueryOptions } from '#src/features/banks/api/get-bank';
import { overviewQueryOptions } from '#src/features/overview/api/get-overview';
import { isApiError } from '#src/lib/api-client';

/**
 * The overview waits for the bank and for this week's jobs, so the page draws whole. A failure of the
 * jobs alone shows on the page (with the navigation still there), not as a route error.
 */
export function overviewLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const bankId = params.bankId;
    if (!bankId) throw data('No bank in the address.', { status: 404 });
    const jobs = queryClient.prefetchQuery(overviewQueryOptions(bankId)); // never rejects
    try {
      await Promise.all([queryClient.ensureQueryData(bankQueryOptions(bankId)), jobs]);
    } catch (error) {
      const url = new URL(request.url);
      if (isApiError(error) && error.status === 401)
        throw redirect(paths.signIn.getHref(url.pathname + url.search));
      if (isApiError(error) && error.status === 404) throw data(error.message, { status: 404 });
      throw error;
    }
    return null;
  };
}
