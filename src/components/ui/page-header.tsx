import type { ReactNode } from 'react';
import { cn } from '#src/lib/cn';

export interface PageHeaderProps {
  title: ReactNode;
  /** One line on what this page is for. */
  description?: ReactNode;
  /** Small text above the title (the bank's name, a breadcrumb). */
  eyebrow?: ReactNode;
  /** The page's main actions, at the right on wide screens and below the title on a phone. */
  actions?: ReactNode;
  /** The page shows its actions further down on a phone (the lot page: after its advice). */
  actionsHiddenOnPhone?: boolean;
  className?: string;
}

export function PageHeader({
  title,
  description,
  eyebrow,
  actions,
  actionsHiddenOnPhone = false,
  className,
}: PageHeaderProps) {
  return (
    <div className={cn('mb-6 flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between', className)}>
      <div className="min-w-0">
        {eyebrow !== undefined ? (
          <p className="text-sm font-semibold uppercase tracking-wide text-seedcoat-700">{eyebrow}</p>
        ) : null}
        <h1 className="text-3xl font-bold leading-tight text-loam-950">{title}</h1>
        {description !== undefined ? <p className="mt-1 max-w-prose text-loam-700">{description}</p> : null}
      </div>
      {actions !== undefined ? (
        <div className={cn('flex flex-wrap gap-2', actionsHiddenOnPhone && 'hidden sm:flex')}>{actions}</div>
      ) : null}
    </div>
  );
}
