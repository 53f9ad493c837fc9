import { cn } from '#src/lib/cn';
import { pct } from './viability-format';

export interface ProjectionBarProps {
  percent: number | null;
  low: number | null;
  high: number | null;
  /** The germination the lot is held to, drawn as a dashed mark on the track when given. */
  threshold?: number;
  className?: string;
}

const clamp = (v: number) => Math.min(100, Math.max(0, v));

/**
 * The projected germination on a 0–100 track: the band runs from the interval's low to its high
 * end and the dark tick marks the estimate. The numbers sit beside it.
 */
export function ProjectionBar({ percent, low, high, threshold, className }: ProjectionBarProps) {
  if (percent === null || low === null || high === null) {
    return <span className={cn('text-sm text-loam-600', className)}>No estimate</span>;
  }
  const from = clamp(low);
  const to = clamp(high);
  return (
    <span className={cn('flex min-w-0 items-center gap-2', className)}>
      <span className="w-10 shrink-0 text-right font-semibold text-loam-900">{pct(percent)}</span>
      <span
        aria-hidden="true"
        className="relative h-3 min-w-12 flex-1 rounded-full border border-loam-200 bg-husk-100"
        data-projection={`${Math.round(low)}-${Math.round(percent)}-${Math.round(high)}`}
      >
        <span
          className="absolute inset-y-0 rounded-full bg-moss-300"
          style={{ left: `${from}%`, width: `${Math.max(to - from, 1.5)}%` }}
        />
        {threshold !== undefined ? (
          <span
            data-threshold={threshold}
            className="absolute -inset-y-1.5 w-0 -translate-x-1/2 border-l-2 border-dashed border-clay-700"
            style={{ left: `${clamp(threshold)}%` }}
          />
        ) : null}
        <span
          className="absolute -inset-y-1 w-0.5 -translate-x-1/2 rounded bg-loam-900"
          style={{ left: `${clamp(percent)}%` }}
        />
      </span>
      <span className="shrink-0 text-xs text-loam-700">
        {Math.round(low)}–{Math.round(high)}
        <span className="sr-only"> percent likely</span>
      </span>
    </span>
  );
}
