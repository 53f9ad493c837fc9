import { useId, useState, type ReactNode } from 'react';
import { cn } from '#src/lib/cn';

export interface CautionProps {
  title: ReactNode;
  children?: ReactNode;
  className?: string;
  /**
   * On a phone, show the title alone with a button that opens the rest, so that a page's own
   * content still starts in the first screen; wider screens always show everything.
   */
  foldOnPhone?: boolean;
}

/**
 * A safety note where something can hurt someone (poisonous seed, swaps across borders, hot water,
 * electrics near water). Amber, with a warning mark; read out politely, never as an error.
 */
export function Caution({ title, children, className, foldOnPhone = false }: CautionProps) {
  const [open, setOpen] = useState(false);
  const bodyId = useId();
  const folds = foldOnPhone && children !== undefined;
  return (
    <div
      role="note"
      className={cn(
        'flex gap-2.5 rounded-lg border border-seedcoat-300 bg-seedcoat-100 px-3 py-2.5 text-seedcoat-900',
        className,
      )}
    >
      <svg
        viewBox="0 0 20 20"
        aria-hidden="true"
        className="mt-0.5 size-5 shrink-0 text-seedcoat-700"
        fill="currentColor"
      >
        <path d="M10 2 1 18h18L10 2Zm-.9 5h1.8v5.5H9.1V7Zm0 7h1.8v1.8H9.1V14Z" />
      </svg>
      <div className="min-w-0 flex-1">
        <div className="flex items-start justify-between gap-2">
          <p className="font-bold">{title}</p>
          {folds ? (
            <button
              type="button"
              aria-expanded={open}
              aria-controls={bodyId}
              onClick={() => setOpen((o) => !o)}
              className="-my-1 shrink-0 rounded px-2 py-1 text-sm font-semibold underline sm:hidden"
            >
              {open ? 'Less' : 'More'}
            </button>
          ) : null}
        </div>
        {children !== undefined ? (
          <div id={bodyId} className={cn('text-sm', folds && !open && 'hidden sm:block')}>
            {children}
          </div>
        ) : null}
      </div>
    </div>
  );
}
