import type { Table } from '@tanstack/react-table';
import { ROUGH_SCORE_WORDS } from '#shared/schemas/germination';
import { useWindowVirtualizer } from '@tanstack/react-virtual';
import { useLayoutEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { RankingItem } from '#shared/schemas/viability';
import { cn } from '#src/lib/cn';
import { formatDay } from '#src/lib/dates';
import { ProjectionBar } from '#src/components/viability/projection-bar';
import { RecommendationButton } from '#src/components/viability/recommendation-badge';
import { Thumb } from './ranking-columns';
import { formatCount, pct, years } from '#src/components/viability/viability-format';

export interface RankingCardsProps {
  table: Table<RankingItem>;
  lotHref: (lotId: string) => string;
}

/** A card's height before it is measured (an opened reason makes it taller). */
const CARD_ESTIMATE = 148;

/**
 * The ranking on a phone: one compact card per lot in the page's own scroll, only the cards near
 * the screen in the page. Pressing the advice opens its reason inside the card.
 */
export function RankingCards({ table, lotHref }: RankingCardsProps) {
  const rows = table.getRowModel().rows;
  const listRef = useRef<HTMLUListElement>(null);
  const [scrollMargin, setScrollMargin] = useState(0);
  const [openId, setOpenId] = useState<string | null>(null);
  useLayoutEffect(() => {
    setScrollMargin(listRef.current ? listRef.current.getBoundingClientRect().top + window.scrollY : 0);
  }, []);
  const virtualizer = useWindowVirtualizer({
    count: rows.length,
    estimateSize: () => CARD_ESTIMATE,
    overscan: 6,
    scrollMargin,
    getItemKey: (index) => rows[index]?.id ?? index,
  });
  const items = virtualizer.getVirtualItems();

  return (
    <ul
      ref={listRef}
      aria-label="Lots ranked by projected germination"
      className="relative"
      style={{ height: virtualizer.getTotalSize() }}
    >
      {items.map((virtualItem) => {
        const row = rows[virtualItem.index]!;
        const lot = row.original;
        const open = openId === lot.lotId;
        const reasonId = `reason-${lot.lotId}`;
        return (
          <li
            key={row.id}
            data-index={virtualItem.index}
            data-lot={lot.code}
            ref={virtualizer.measureElement}
            className="absolute inset-x-0 top-0 pb-2"
            style={{ transform: `translateY(${virtualItem.start - virtualizer.options.scrollMargin}px)` }}
          >
            <div
              className={cn(
                'rounded-xl border bg-white p-3 shadow-sm',
                row.getIsSelected() ? 'border-moss-400' : 'border-loam-200',
              )}
            >
              <div className="flex items-start gap-3">
                <Thumb item={lot} className="size-12" />
                <div className="min-w-0 flex-1">
                  <div className="flex items-center justify-between gap-2">
                    <Link to={lotHref(lot.lotId)} className="truncate font-bold text-moss-800 underline">
                      {lot.code}
                    </Link>
                    <RecommendationButton
                      value={lot.recommendation}
                      reason={lot.reason}
                      aria-expanded={open}
                      aria-controls={reasonId}
                      onClick={() => setOpenId(open ? null : lot.lotId)}
                    />
                  </div>
                  <p className="truncate font-semibold text-loam-900">
                    {lot.species} · {lot.variety}
                  </p>
                  {lot.treated ? (
                    <p className="text-sm font-semibold text-clay-800">Treated seed: wear gloves</p>
                  ) : null}
                </div>
                <input
                  type="checkbox"
                  className="mt-1 size-6 shrink-0 accent-moss-700"
                  aria-label={`Select ${lot.code}`}
                  checked={row.getIsSelected()}
                  onChange={row.getToggleSelectedHandler()}
                />
              </div>
              <div className="mt-2 text-sm">
                <span className="sr-only">Projected germination </span>
                <ProjectionBar
                  percent={lot.projectedPercent}
                  low={lot.projectedLow}
                  high={lot.projectedHigh}
                />
              </div>
              <p className="num mt-1 flex flex-wrap justify-between gap-x-3 text-sm text-loam-700">
                <span>
                  {lot.lastTestDate ? `Tested ${formatDay(lot.lastTestDate)}` : 'Not tested'}
                  {lot.lastPercent !== null
                    ? ` · ${lot.lastPercentEstimated ? 'about ' : ''}${pct(lot.lastPercent)} germinated`
                    : lot.lastScore
                      ? ` · seedlings came up: ${ROUGH_SCORE_WORDS[lot.lastScore]}`
                      : ''}{' '}
                  · {years(Math.max(0, lot.ageYears))}
                </span>
                <span className="font-semibold text-loam-900">
                  {lot.seedsOnHand === null ? 'Amount not known' : `${formatCount(lot.seedsOnHand)} seeds`}
                  {lot.status === 'depleted' ? ' · used up' : ''}
                </span>
              </p>
              <p
                id={reasonId}
                hidden={!open}
                className="mt-2 rounded-lg bg-husk-100 px-3 py-2 text-sm text-loam-800"
              >
                {lot.reason}
              </p>
            </div>
          </li>
        );
      })}
    </ul>
  );
}
