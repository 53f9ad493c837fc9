import type { ReactNode } from 'react';
import { Button, buttonStyles } from '../ui/button';

export interface ErrorFallbackProps {
  title?: ReactNode;
  message?: ReactNode;
  /** Technical detail, shown folded away and only in development builds. */
  detail?: string | undefined;
  /** What "Try again" does; reloads the page when not given. */
  onRetry?: () => void;
  /** Fill the screen (when there is no app shell around it). */
  fullPage?: boolean;
}

/**
 * What a person sees when a page breaks. It links home with a plain <a>, not the router, so it
 * works even when the router itself is what failed, and the fresh page load clears bad state.
 */
export function ErrorFallback({
  title = 'Something went wrong on this page',
  message = 'Anything already saved is safe: a page that fails to show does not change your records. Try again, or start from the first page.',
  detail,
  onRetry,
  fullPage = false,
}: ErrorFallbackProps) {
  const body = (
    <div
      role="alert"
      className="mx-auto max-w-lg rounded-xl border border-clay-200 bg-white p-6 text-center shadow-sm"
    >
      <svg
        viewBox="0 0 48 48"
        aria-hidden="true"
        className="mx-auto mb-3 size-12 text-clay-600"
        fill="none"
        stroke="currentColor"
        strokeWidth="2.5"
        strokeLinecap="round"
      >
        <path d="M24 42V26" />
        <path d="M24 28c0-6-4-9-10-10 0 6 4 9 10 10Z" />
        <path d="M24 26c1-4 4-6 9-6" strokeDasharray="3 3" />
        <path d="M14 42h20" />
      </svg>
      <h1 className="text-2xl font-bold text-loam-950">{title}</h1>
      <p className="mt-2 text-loam-700">{message}</p>
      <div className="mt-6 flex flex-col justify-center gap-3 sm:flex-row">
        <Button onClick={onRetry ?? (() => window.location.reload())}>Try again</Button>
        <a href="/" className={buttonStyles({ variant: 'secondary' })}>
          Go to the start page
        </a>
      </div>
      {import.meta.env.DEV && detail ? (
        <details className="mt-6 text-left">
          <summary className="cursor-pointer text-sm font-semibold text-loam-700">
            Details for developers
          </summary>
          <pre className="mt-2 max-h-64 overflow-auto whitespace-pre-wrap rounded-lg bg-loam-100 p-3 text-xs text-loam-900">
            {detail}
          </pre>
        </details>
      ) : null}
    </div>
  );
  if (!fullPage) return <div className="py-8">{body}</div>;
  return <div className="flex min-h-dvh items-center justify-center bg-husk-50 p-4">{body}</div>;
}

export function describeError(error: unknown): string | undefined {
  if (error instanceof Error) return error.stack ?? `${error.name}: ${error.message}`;
  if (error === undefined || error === null) return undefined;
  try {
    return JSON.stringify(error, null, 2);
  } catch {
    return String(error);
  }
}
