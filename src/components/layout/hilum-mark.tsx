import { cn } from '#src/lib/cn';

export interface HilumMarkProps {
  className?: string;
}

/** Hilum's mark: a bean-shaped seed lying on its side, its pale hilum scar on the inner curve. */
export function HilumMark({ className }: HilumMarkProps) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" focusable="false" className={cn('size-8', className)}>
      <g transform="rotate(-20 16 16)">
        <path
          d="M3.5 16.5C3.5 11.2 7.5 8.8 11.5 9.6C13.3 10 14.5 11.2 16 11.2S18.7 10 20.5 9.6C24.5 8.8 28.5 11.2 28.5 16.5C28.5 21.6 23 24.6 16 24.6S3.5 21.6 3.5 16.5Z"
          className="fill-seedcoat-500"
        />
        <ellipse cx="16" cy="13.3" rx="3.1" ry="1.35" className="fill-husk-50" />
        <path d="M14 13.3h4" className="stroke-seedcoat-700" strokeWidth="0.8" strokeLinecap="round" />
      </g>
    </svg>
  );
}

/** The mark and the name together, as the header shows them. */
export function HilumWordmark({ className }: HilumMarkProps) {
  return (
    <span className={cn('inline-flex items-center gap-2', className)}>
      <HilumMark className="size-9" />
      <span className="text-2xl font-bold tracking-tight text-loam-950">Hilum</span>
    </span>
  );
}
