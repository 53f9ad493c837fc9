import { cn } from '#src/lib/cn';

export type SpinnerSize = 'sm' | 'md' | 'lg';

const sizes: Record<SpinnerSize, string> = { sm: 'size-4', md: 'size-6', lg: 'size-10' };

export interface SpinnerProps {
  size?: SpinnerSize;
  /** Read out to screen readers; ignored when `decorative`. */
  label?: string;
  /** Inside something that already says it is busy (a loading button). */
  decorative?: boolean;
  className?: string;
}

export function Spinner({ size = 'md', label = 'Loading', decorative = false, className }: SpinnerProps) {
  const svg = (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      aria-hidden="true"
      className={cn('motion-safe:animate-spin', sizes[size], className)}
    >
      <circle cx="12" cy="12" r="9.5" stroke="currentColor" strokeOpacity="0.25" strokeWidth="3" />
      <path d="M21.5 12A9.5 9.5 0 0 0 12 2.5" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
  if (decorative) return svg;
  return (
    <span role="status" className="inline-flex items-center">
      {svg}
      <span className="sr-only">{label}</span>
    </span>
  );
}

export interface LoadingProps {
  /** What is loading, in words ("Loading the outbox"). */
  label?: string;
  className?: string;
  /**
   * The height in CSS pixels of what will replace it (a chart), kept while it loads so that
   * nothing below moves under a finger when it arrives.
   */
  height?: number;
}

/** A block-level loading state for a card or a page section. */
export function Loading({ label = 'Loading', className, height }: LoadingProps) {
  return (
    <div
      role="status"
      style={height === undefined ? undefined : { height }}
      className={cn(
        'flex items-center justify-center gap-3 text-loam-600',
        height === undefined && 'py-10',
        className,
      )}
    >
      <Spinner size="md" decorative />
      <span>{label}…</span>
    </div>
  );
}
