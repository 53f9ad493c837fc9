import type { HTMLAttributes, ReactNode } from 'react';
import { cn } from '#src/lib/cn';

export interface CardProps extends Omit<HTMLAttributes<HTMLElement>, 'title'> {
  title?: ReactNode;
  description?: ReactNode;
  /** Buttons or links at the right of the title row. */
  actions?: ReactNode;
  /** The title's heading level, so the page outline stays right (default 2). */
  headingLevel?: 2 | 3 | 4;
  /** Drop the inner padding (for a table or list that runs edge to edge). */
  flush?: boolean;
}

export function Card({
  title,
  description,
  actions,
  headingLevel = 2,
  flush = false,
  className,
  children,
  ...rest
}: CardProps) {
  const Heading = `h${headingLevel}` as const;
  const hasHeader = title !== undefined || actions !== undefined;
  return (
    <section
      className={cn('rounded-xl border border-loam-200 bg-white shadow-sm shadow-loam-900/5', className)}
      {...rest}
    >
      {hasHeader ? (
        <header
          className={cn(
            'flex flex-wrap items-start justify-between gap-3 px-4 pt-4 sm:px-5',
            flush ? 'pb-3 border-b border-loam-100' : 'pb-0',
          )}
        >
          <div className="min-w-0">
            {title !== undefined ? (
              <Heading className="text-lg font-bold leading-snug text-loam-900">{title}</Heading>
            ) : null}
            {description !== undefined ? <p className="mt-0.5 text-sm text-loam-600">{description}</p> : null}
          </div>
          {actions !== undefined ? <div className="flex shrink-0 items-center gap-2">{actions}</div> : null}
        </header>
      ) : null}
      <div className={cn(!flush && 'p-4 sm:p-5', !flush && hasHeader && 'pt-3 sm:pt-3')}>{children}</div>
    </section>
  );
}
