import type { QueryClient } from '@tanstack/react-query';
import { data, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '../config/paths';
import { ensureMe } from '../features/auth/api/get-me';
import { bankQueryOptions } from '../features/banks/api/get-bank';
import { invitationsQueryOptions } from '../features/banks/api/get-invitations';
import { membersQueryOptions } from '../features/banks/api/get-members';
import { isApiError } from '../lib/api-client';
import { safeNext } from '../lib/safe-next';

const hereOf = (request: Request) => {
  const url = new URL(request.url);
  return url.pathname + url.search;
};

/** Every page behind sign-in: nobody signed in → /sign-in?next=<this page>. */
export function requireSignIn(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await ensureMe(queryClient);
    if (!me) throw redirect(paths.signIn.getHref(hereOf(request)));
    return null;
  };
}

/** The sign-in and sign-up pages: someone already signed in goes on to `next`, or to their bank. */
export function redirectIfSignedIn(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await ensureMe(queryClient);
    if (me) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
    return null;
  };
}

/** `/`: the first bank's overview, or the welcome page for someone in no bank yet. */
export function homeLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await ensureMe(queryClient);
    if (!me) throw redirect(paths.signIn.getHref(hereOf(request)));
    const first = me.memberships[0];
    if (first) throw redirect(paths.overview.getHref(first.bankId));
    return null;
  };
}

/** Turns an API failure in a loader into what the router shows: sign in, or "not found". */
function routeFailure(error: unknown, request: Request): never {
  if (isApiError(error) && error.status === 401) throw redirect(paths.signIn.getHref(hereOf(request)));
  if (isApiError(error) && error.status === 404) throw data(error.message, { status: 404 });
  throw error;
}

function bankIdOf(params: LoaderFunctionArgs['params']): string {
  const bankId = params.bankId;
  if (!bankId) throw data('No bank in the address.', { status: 404 });
  return bankId;
}

/** `/banks/:bankId/…`: the bank and the caller's role, or not-found for someone not in it. */
export function bankLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    try {
      await queryClient.ensureQueryData(bankQueryOptions(bankIdOf(params)));
    } catch (error) {
      routeFailure(error, request);
    }
    return null;
  };
}

/** The members page: the list for everyone, the open invitations for owners. */
export function membersLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const bankId = bankIdOf(params);
    try {
      const [{ role }] = await Promise.all([
        queryClient.ensureQueryData(bankQueryOptions(bankId)),
        queryClient.ensureQueryData(membersQueryOptions(bankId)),
      ]);
      if (role === 'owner') await queryClient.ensureQueryData(invitationsQueryOptions(bankId));
    } catch (error) {
      routeFailure(error, request);
    }
    return null;
  };
}
