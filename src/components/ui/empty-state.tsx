import type { ReactNode } from 'react';
import { cn } from '#src/lib/cn';

export interface EmptyStateProps {
  title: ReactNode;
  description?: ReactNode;
  /** What to do about it: usually one Button or link. */
  action?: ReactNode;
  /** A decorative picture above the title; a sprouting seed by default. */
  icon?: ReactNode;
  className?: string;
}

export function EmptyState({ title, description, action, icon, className }: EmptyStateProps) {
  return (
    <div
      className={cn(
        'flex flex-col items-center rounded-xl border border-dashed border-loam-300 bg-husk-50 px-6 py-10 text-center',
        className,
      )}
    >
      <div aria-hidden="true" className="mb-3 text-moss-600">
        {icon ?? <SproutIcon />}
      </div>
      <p className="text-lg font-bold text-loam-900">{title}</p>
      {description !== undefined ? <p className="mt-1 max-w-md text-loam-700">{description}</p> : null}
      {action !== undefined ? <div className="mt-5">{action}</div> : null}
    </div>
  );
}

function SproutIcon() {
  return (
    <svg
      viewBox="0 0 48 48"
      className="size-12"
      fill="none"
      stroke="currentColor"
      strokeWidth="2.5"
      strokeLinecap="round"
    >
      <path d="M24 42V24" />
      <path d="M24 26c0-7-5-11-12-11 0 7 5 11 12 11Z" fill="currentColor" fillOpacity="0.15" />
      <path d="M24 22c0-6 4-10 11-10 0 6-4 10-11 10Z" fill="currentColor" fillOpacity="0.15" />
      <path d="M14 42h20" className="text-loam-400" stroke="currentColor" />
    </svg>
  );
}
