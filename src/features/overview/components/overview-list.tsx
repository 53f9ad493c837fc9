import { useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '#src/lib/cn';

export type BadgeTone = 'urgent' | 'now' | 'later';

const badgeTones: Record<BadgeTone, string> = {
  urgent: 'border-clay-300 bg-clay-100 text-clay-800',
  now: 'border-moss-300 bg-moss-100 text-moss-800',
  later: 'border-frost-200 bg-frost-50 text-frost-800',
};

export function Badge({ tone, children }: { tone: BadgeTone; children: ReactNode }) {
  return (
    <span
      className={cn(
        'inline-flex shrink-0 items-center rounded-full border px-2 py-0.5 text-sm font-semibold',
        badgeTones[tone],
      )}
    >
      {children}
    </span>
  );
}

export interface OverviewRow {
  key: string;
  href: string;
  title: ReactNode;
  /** One or two short lines under the title. */
  detail?: ReactNode;
  badge?: ReactNode;
}

/** How many rows a card shows before "Show all" (a phone screen holds about this many). */
const FIRST_ROWS = 5;

/** Rows that each open the page where the job is done: a whole-row link, a thumb's width tall. */
export function OverviewList({ rows, label }: { rows: OverviewRow[]; label: string }) {
  const [all, setAll] = useState(false);
  const shown = all ? rows : rows.slice(0, FIRST_ROWS);
  const hidden = rows.length - shown.length;
  return (
    <>
      <ul aria-label={label} className="divide-y divide-loam-100">
        {shown.map((row) => (
          <li key={row.key}>
            <Link
              to={row.href}
              className="group flex min-h-14 items-center gap-3 px-4 py-3 hover:bg-husk-50 focus-visible:bg-husk-50 sm:px-5"
            >
              <span className="min-w-0 flex-1">
                <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
                  <span className="font-semibold text-loam-900 underline-offset-2 group-hover:underline">
                    {row.title}
                  </span>
                  {row.badge}
                </span>
                {row.detail !== undefined ? (
                  <span className="mt-0.5 block text-sm text-loam-700">{row.detail}</span>
                ) : null}
              </span>
              <svg
                viewBox="0 0 20 20"
                aria-hidden="true"
                className="size-5 shrink-0 text-loam-400"
                fill="currentColor"
              >
                <path d="M7.3 4.3 13 10l-5.7 5.7-1.4-1.4L10.2 10 5.9 5.7l1.4-1.4Z" />
              </svg>
            </Link>
          </li>
        ))}
      </ul>
      {hidden > 0 ? (
        <div className="border-t border-loam-100 px-4 py-2 sm:px-5">
          <button
            type="button"
            onClick={() => setAll(true)}
            className="-ml-2 min-h-11 rounded-lg px-2 font-semibold text-moss-800 underline hover:bg-moss-50"
          >
            Show {hidden} more
          </button>
        </div>
      ) : null}
    </>
  );
}

/** What a card says when there is nothing to do, with the next step as a link. */
export function CardEmpty({ children, action }: { children: ReactNode; action?: ReactNode }) {
  return (
    <div className="grid gap-2 px-4 pb-4 pt-3 sm:px-5">
      <p className="text-loam-700">{children}</p>
      {action !== undefined ? <div>{action}</div> : null}
    </div>
  );
}

/** A text link that reads as the next step. */
export function NextLink({ to, children }: { to: string; children: ReactNode }) {
  return (
    <Link to={to} className="inline-flex min-h-11 items-center font-semibold text-moss-800 underline">
      {children}
    </Link>
  );
}
