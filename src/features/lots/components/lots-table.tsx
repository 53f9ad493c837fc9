import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { LotDto } from '../../../../shared/schemas/lots';
import { SelectField } from '../../../components/ui/select-field';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { harvestLabel, harvestSortKey, originLabels, seedsLabel, statusOrder } from './lot-format';
import { StatusBadge } from './status-badge';

const column = createColumnHelper<LotDto>();

function Thumb({ lot, size }: { lot: LotDto; size: 'sm' | 'md' }) {
  const box = size === 'sm' ? 'size-12' : 'size-16';
  if (!lot.thumbUrl) {
    return (
      <span
        title="No photo yet"
        className={cn(box, 'inline-flex shrink-0 items-center justify-center rounded-lg border border-dashed border-loam-300 bg-husk-50 text-loam-400')}
      >
        <svg viewBox="0 0 24 24" aria-hidden="true" className="size-6" fill="none" stroke="currentColor" strokeWidth="1.8">
          <rect x="3" y="6" width="18" height="14" rx="2" />
          <circle cx="12" cy="13" r="3.5" />
          <path d="M8 6l1.5-2h5L16 6" />
        </svg>
        <span className="sr-only">No photo</span>
      </span>
    );
  }
  return (
    <img
      src={lot.thumbUrl}
      alt={`Packet of ${lot.code}`}
      loading="lazy"
      className={cn(box, 'shrink-0 rounded-lg border border-loam-200 bg-loam-100 object-cover')}
    />
  );
}

function columns(bankId: string) {
  return [
    column.display({ id: 'photo', header: () => <span className="sr-only">Photo</span>, cell: (c) => <Thumb lot={c.row.original} size="sm" /> }),
    column.accessor('code', {
      header: 'Code',
      sortingFn: 'alphanumeric',
      cell: (c) => (
        <Link to={paths.lot.getHref(bankId, c.row.original.id)} className="font-bold whitespace-nowrap text-moss-800 underline">
          {c.getValue()}
        </Link>
      ),
    }),
    column.accessor('speciesName', {
      header: 'Species',
      cell: (c) => (
        <>
          <span className="block">{c.getValue()}</span>
          <span className="block text-sm italic text-loam-600">{c.row.original.scientificName}</span>
        </>
      ),
    }),
    column.accessor('variety', { header: 'Variety' }),
    column.accessor(harvestSortKey, { id: 'harvest', header: 'Harvest or season', cell: (c) => harvestLabel(c.row.original) }),
    column.accessor('origin', {
      header: 'Origin',
      cell: (c) => (
        <>
          {originLabels[c.getValue()]}
          {c.row.original.sourceName ? <span className="block text-sm text-loam-600">{c.row.original.sourceName}</span> : null}
        </>
      ),
    }),
    column.accessor('seedsOnHand', {
      header: 'Seeds on hand',
      meta: { numeric: true },
      cell: (c) => (
        <span title={c.row.original.quantityEstimated ? 'Estimated from a weight' : undefined}>{seedsLabel(c.row.original)}</span>
      ),
    }),
    column.accessor((lot) => statusOrder.indexOf(lot.status), {
      id: 'status',
      header: 'Status',
      cell: (c) => <StatusBadge status={c.row.original.status} />,
    }),
  ];
}

const sortChoices = [
  { value: 'code:asc', label: 'Code' },
  { value: 'speciesName:asc', label: 'Species' },
  { value: 'harvest:desc', label: 'Newest harvest first' },
  { value: 'harvest:asc', label: 'Oldest harvest first' },
  { value: 'seedsOnHand:desc', label: 'Most seeds first' },
  { value: 'seedsOnHand:asc', label: 'Fewest seeds first' },
  { value: 'status:asc', label: 'Status' },
];

export interface LotsTableProps {
  bankId: string;
  lots: LotDto[];
}

/**
 * The bank's lots: a sortable table from 768 px, a list of cards on a phone (same sort order).
 * Sorting works on the lots loaded so far; the server pages them by code.
 */
export function LotsTable({ bankId, lots }: LotsTableProps) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'code', desc: false }]);
  const tableColumns = useMemo(() => columns(bankId), [bankId]);
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design
  const table = useReactTable({
    data: lots,
    columns: tableColumns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const rows = table.getRowModel().rows;
  const currentSort = sorting[0] ? `${sorting[0].id}:${sorting[0].desc ? 'desc' : 'asc'}` : 'code:asc';

  return (
    <>
      <div className="hidden overflow-x-auto rounded-xl border border-loam-200 bg-white shadow-sm md:block">
        <table className="w-full text-left">
          <caption className="sr-only">Lots in this bank. Column headers sort the table.</caption>
          <thead className="border-b border-loam-200 bg-husk-100 text-sm">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const numeric = (header.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={cn('px-2 py-1 font-semibold text-loam-800', numeric && 'text-right')}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className={cn('inline-flex min-h-11 items-center gap-1 rounded px-1 hover:bg-husk-200', numeric && 'flex-row-reverse')}
                        >
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden="true" className="w-3 text-loam-600">
                            {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}
                          </span>
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-loam-100">
            {rows.map((row) => (
              <tr key={row.id} className="hover:bg-husk-50">
                {row.getVisibleCells().map((cell) => {
                  const numeric = (cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                  return (
                    <td key={cell.id} className={cn('px-3 py-2 align-middle', numeric && 'text-right font-semibold')}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <div className="grid gap-3 md:hidden">
        <SelectField
          label="Sort by"
          value={sortChoices.some((c) => c.value === currentSort) ? currentSort : 'code:asc'}
          onChange={(event) => {
            const [id = 'code', direction] = event.target.value.split(':');
            setSorting([{ id, desc: direction === 'desc' }]);
          }}
        >
          {sortChoices.map((choice) => (
            <option key={choice.value} value={choice.value}>
              {choice.label}
            </option>
          ))}
        </SelectField>
        <ul aria-label="Lots in this bank" className="grid gap-2">
          {rows.map(({ original: lot }) => (
            <li key={lot.id}>
              <Link
                to={paths.lot.getHref(bankId, lot.id)}
                className="flex gap-3 rounded-xl border border-loam-200 bg-white p-3 shadow-sm active:bg-husk-100"
              >
                <Thumb lot={lot} size="md" />
                <div className="min-w-0 flex-1">
                  <div className="flex flex-wrap items-baseline justify-between gap-x-2">
                    <span className="font-bold text-moss-800">{lot.code}</span>
                    <StatusBadge status={lot.status} className="text-xs" />
                  </div>
                  <p className="truncate font-semibold text-loam-900">
                    {lot.speciesName} · {lot.variety}
                  </p>
                  <p className="flex flex-wrap justify-between gap-x-3 text-sm text-loam-700">
                    <span>
                      {harvestLabel(lot)} · {originLabels[lot.origin]}
                    </span>
                    <span className="num font-semibold text-loam-900">{seedsLabel(lot)} seeds</span>
                  </p>
                </div>
              </Link>
            </li>
          ))}
        </ul>
      </div>
    </>
  );
}
