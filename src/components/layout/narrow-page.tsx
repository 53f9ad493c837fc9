import type { ReactNode } from 'react';

export interface NarrowPageProps {
  title: ReactNode;
  description?: ReactNode;
  /** A message above the form (a notice carried from another page). */
  notice?: ReactNode;
  children: ReactNode;
  /** Links below the card ("No account yet? Create one"). */
  footer?: ReactNode;
}

/** A single-column page for signing in and the like: one card, easy to fill in on a phone. */
export function NarrowPage({ title, description, notice, children, footer }: NarrowPageProps) {
  return (
    <div className="mx-auto w-full max-w-md">
      <h1 className="text-3xl font-bold leading-tight text-loam-950">{title}</h1>
      {description !== undefined ? <p className="mt-1 text-loam-700">{description}</p> : null}
      {notice !== undefined ? <div className="mt-4">{notice}</div> : null}
      <div className="mt-5 rounded-xl border border-loam-200 bg-white p-4 shadow-sm shadow-loam-900/5 sm:p-6">
        {children}
      </div>
      {footer !== undefined ? <div className="mt-5 grid gap-2 text-loam-800">{footer}</div> : null}
    </div>
  );
}
