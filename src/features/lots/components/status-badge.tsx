import { cn } from '#src/lib/cn';
import type { LotStatus } from '#src/lib/bank-api';
import { statusLabels } from './lot-format';

const looks: Record<LotStatus, string> = {
  active: 'border-moss-300 bg-moss-100 text-moss-800',
  depleted: 'border-loam-300 bg-loam-100 text-loam-800',
  retired: 'border-clay-300 bg-clay-100 text-clay-800',
};

export function StatusBadge({ status, className }: { status: LotStatus; className?: string }) {
  return (
    <span
      className={cn(
        'inline-flex items-center rounded-full border px-2.5 py-0.5 text-sm font-semibold',
        looks[status],
        className,
      )}
    >
      {statusLabels[status]}
    </span>
  );
}
