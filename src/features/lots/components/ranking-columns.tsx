import { createColumnHelper, type Column } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { ROUGH_SCORE_WORDS } from '#shared/schemas/germination';
import type { RankingItem } from '#shared/schemas/viability';
import { cn } from '#src/lib/cn';
import { formatDay } from '#src/lib/dates';
import { ProjectionBar } from '#src/components/viability/projection-bar';
import { RecommendationButton } from '#src/components/viability/recommendation-badge';
import type { RankingColumnId } from './ranking-search';
import {
  days,
  formatCount,
  pct,
  recommendationOrder,
  years,
} from '#src/components/viability/viability-format';

export interface RankingColumnMeta {
  /** The column's name in the visibility menu and the phone's sort picker. */
  label: string;
  /** Fixed width in px: the virtualized rows keep their columns aligned without measuring. */
  width: number;
  numeric?: boolean;
}

export const columnMeta = (column: Column<RankingItem, unknown>) =>
  column.columnDef.meta as RankingColumnMeta | undefined;

const column = createColumnHelper<RankingItem>();

export function Thumb({ item, className }: { item: RankingItem; className?: string }) {
  if (!item.thumbUrl) {
    return (
      <span
        aria-hidden="true"
        className={cn(
          'inline-block shrink-0 rounded-md border border-dashed border-loam-300 bg-husk-50',
          className,
        )}
      />
    );
  }
  return (
    <img
      src={item.thumbUrl}
      alt=""
      loading="lazy"
      className={cn('shrink-0 rounded-md border border-loam-200 bg-loam-100 object-cover', className)}
    />
  );
}

export interface RankingColumnsOptions {
  lotHref: (lotId: string) => string;
  openReason: (item: RankingItem, anchor: HTMLElement) => void;
}

const dash = <span className="text-loam-500">—</span>;

/** The ranking's columns; every one but the checkbox sorts. Nulls sort last either way. */
export function rankingColumns({ lotHref, openReason }: RankingColumnsOptions) {
  const meta = (label: string, width: number, numeric = false): RankingColumnMeta => ({
    label,
    width,
    numeric,
  });
  const ids: Record<RankingColumnId, RankingColumnId> = {
    code: 'code',
    species: 'species',
    variety: 'variety',
    age: 'age',
    lastTest: 'lastTest',
    lastPercent: 'lastPercent',
    projected: 'projected',
    meanDays: 'meanDays',
    seeds: 'seeds',
    recommendation: 'recommendation',
  };
  return [
    column.display({
      id: 'select',
      enableSorting: false,
      enableHiding: false,
      meta: meta('Select', 44),
      header: ({ table }) => (
        <input
          type="checkbox"
          className="size-5 accent-moss-700"
          aria-label="Select every lot shown"
          checked={table.getIsAllRowsSelected()}
          ref={(el) => {
            if (el) el.indeterminate = table.getIsSomeRowsSelected();
          }}
          onChange={table.getToggleAllRowsSelectedHandler()}
        />
      ),
      cell: ({ row }) => (
        <input
          type="checkbox"
          className="size-5 accent-moss-700"
          aria-label={`Select ${row.original.code}`}
          checked={row.getIsSelected()}
          onChange={row.getToggleSelectedHandler()}
        />
      ),
    }),
    column.accessor('code', {
      id: ids.code,
      header: 'Code',
      enableHiding: false,
      sortingFn: 'alphanumeric',
      sortDescFirst: false,
      meta: meta('Code', 156),
      cell: (c) => (
        <span className="flex min-w-0 items-center gap-2">
          <Thumb item={c.row.original} className="size-8" />
          <span className="min-w-0">
            <Link
              to={lotHref(c.row.original.lotId)}
              className="block truncate font-bold text-moss-800 underline"
            >
              {c.getValue()}
            </Link>
            {c.row.original.status === 'depleted' ? (
              <span className="block text-xs text-loam-600">used up</span>
            ) : null}
            {c.row.original.treated ? (
              <span className="block text-xs font-semibold text-clay-800">treated seed</span>
            ) : null}
          </span>
        </span>
      ),
    }),
    column.accessor('species', {
      id: ids.species,
      header: 'Species',
      sortingFn: 'text',
      sortDescFirst: false,
      meta: meta('Species', 104),
      cell: (c) => <span className="block truncate">{c.getValue()}</span>,
    }),
    column.accessor('variety', {
      id: ids.variety,
      header: 'Variety',
      sortingFn: 'text',
      sortDescFirst: false,
      meta: meta('Variety', 120),
      cell: (c) => (
        <span className="block truncate" title={c.getValue()}>
          {c.getValue()}
        </span>
      ),
    }),
    column.accessor('ageYears', {
      id: ids.age,
      header: 'Age',
      sortDescFirst: true,
      meta: meta('Age', 64, true),
      cell: (c) => years(Math.max(0, c.getValue())),
    }),
    column.accessor((r) => r.lastTestDate ?? undefined, {
      id: ids.lastTest,
      header: 'Last test',
      sortUndefined: 'last',
      sortDescFirst: true,
      meta: meta('Last test', 104),
      cell: (c) => {
        const v = c.getValue();
        return v ? (
          <span className="whitespace-nowrap">{formatDay(v)}</span>
        ) : (
          <span className="text-loam-600">Not tested</span>
        );
      },
    }),
    column.accessor((r) => r.lastPercent ?? undefined, {
      id: ids.lastPercent,
      // The latest test's stored result: normal seedlings of the seeds sown in the trays in its
      // figures (a running test's counted trays so far), the same figure as on the test page.
      header: 'Latest %',
      sortUndefined: 'last',
      sortDescFirst: true,
      meta: meta('Latest germination', 76, true),
      cell: (c) => {
        const v = c.getValue();
        const r = c.row.original;
        // An estimated figure (seeds sown by weight or guess) says so; a scored test has only words.
        if (v === undefined) return r.lastScore ? `${ROUGH_SCORE_WORDS[r.lastScore]} came up` : dash;
        return r.lastPercentEstimated ? `about ${pct(v)}` : pct(v);
      },
    }),
    column.accessor((r) => r.projectedPercent ?? undefined, {
      id: ids.projected,
      header: 'Projected',
      sortUndefined: 'last',
      sortDescFirst: true,
      meta: meta('Projected', 188),
      cell: ({ row: { original: r } }) => (
        <ProjectionBar percent={r.projectedPercent} low={r.projectedLow} high={r.projectedHigh} />
      ),
    }),
    column.accessor((r) => r.meanDays ?? undefined, {
      id: ids.meanDays,
      header: 'Mean days',
      sortUndefined: 'last',
      sortDescFirst: false,
      meta: meta('Mean days', 76, true),
      cell: (c) => {
        const v = c.getValue();
        return v === undefined ? dash : days(v);
      },
    }),
    // A lot whose amount is not known sorts last and says so: not known is not zero.
    column.accessor((r) => r.seedsOnHand ?? undefined, {
      id: ids.seeds,
      header: 'Seeds',
      sortDescFirst: true,
      sortUndefined: 'last',
      meta: meta('Seeds on hand', 84, true),
      cell: (c) => {
        const v = c.getValue();
        return v === undefined ? 'Not known' : formatCount(v);
      },
    }),
    column.accessor((r) => recommendationOrder.indexOf(r.recommendation), {
      id: ids.recommendation,
      header: 'Advice',
      sortDescFirst: false,
      meta: meta('Advice', 120),
      cell: ({ row: { original: r } }) => (
        <RecommendationButton
          value={r.recommendation}
          reason={r.reason}
          aria-haspopup="dialog"
          onClick={(event) => openReason(r, event.currentTarget)}
        />
      ),
    }),
  ];
}
