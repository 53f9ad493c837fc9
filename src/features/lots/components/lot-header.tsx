import type { ReactNode } from 'react';
import type { LotDto } from '#shared/schemas/lots';
import { PageHeader } from '#src/components/ui/page-header';
import { amountLabel } from './lot-format';
import { StatusBadge } from './status-badge';

/** The lot page's title: code, species, variety, status and seeds on hand. */
export function LotHeader({
  lot,
  eyebrow,
  actions,
  actionsHiddenOnPhone,
}: {
  lot: LotDto;
  eyebrow?: ReactNode;
  actions?: ReactNode;
  actionsHiddenOnPhone?: boolean;
}) {
  return (
    <PageHeader
      eyebrow={eyebrow}
      title={
        <span className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <span>{lot.code}</span>
          <StatusBadge status={lot.status} className="text-base" />
        </span>
      }
      description={
        <>
          <span className="font-semibold text-loam-900">{lot.speciesName}</span>{' '}
          <span className="italic">{lot.scientificName}</span> · {lot.variety}
          <span className="num mt-1 block font-semibold text-loam-900" data-testid="lot-amount">
            {amountLabel(lot)}
          </span>
        </>
      }
      actions={actions}
      actionsHiddenOnPhone={actionsHiddenOnPhone}
    />
  );
}
