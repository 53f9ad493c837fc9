import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { describeError, ErrorFallback } from '#src/components/errors/error-fallback';
import { isApiError } from '#src/lib/api-client';
import { NotFoundContent } from './not-found';

export interface RouteErrorProps {
  /** Outside the app shell (the shell itself failed), so fill the screen. */
  fullPage?: boolean;
}

/** The router's errorElement: a 404 from a loader reads as "not found", anything else as a failure. */
export function RouteError({ fullPage = false }: RouteErrorProps) {
  const error = useRouteError();
  // A loader's "not found", or a page whose bank disappeared under it (deleted, or you were removed).
  if ((isRouteErrorResponse(error) && error.status === 404) || (isApiError(error) && error.status === 404)) {
    return fullPage ? (
      <div className="mx-auto max-w-3xl p-6">
        <NotFoundContent />
      </div>
    ) : (
      <NotFoundContent />
    );
  }
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}\n${describeError(error.data) ?? ''}`
    : describeError(error);
  return <ErrorFallback fullPage={fullPage} detail={detail} />;
}
