import { cn } from '#src/lib/cn';

export interface ProgressBarProps {
  /** 0 to 1. */
  value: number;
  label: string;
  className?: string;
}

/** A labelled progress bar (an upload), with the percentage in words beside it. */
export function ProgressBar({ value, label, className }: ProgressBarProps) {
  const percent = Math.round(Math.min(1, Math.max(0, value)) * 100);
  return (
    <div className={cn('grid gap-1', className)}>
      <div className="flex justify-between gap-3 text-sm font-semibold text-loam-800">
        <span>{label}</span>
        <span className="num">{percent}%</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-2.5 overflow-hidden rounded-full bg-loam-100"
      >
        <div
          className="h-full rounded-full bg-moss-600 transition-[width]"
          style={{ width: `${percent}%` }}
        />
      </div>
    </div>
  );
}
