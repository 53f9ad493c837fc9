import { flexRender, type Table } from '@tanstack/react-table';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useRef } from 'react';
import type { RankingItem } from '#shared/schemas/viability';
import { cn } from '#src/lib/cn';
import { columnMeta } from './ranking-columns';

/** Every row is this tall, so the virtualizer can place rows without measuring them. */
export const ROW_HEIGHT = 56;

/**
 * A header press: a column that is not the first sort becomes the only one, in its own first
 * direction (numbers largest first); pressing the first sort again turns it round. Shift adds or
 * turns a further sort, as TanStack Table does.
 */
function sortBy(table: Table<RankingItem>, columnId: string, multi: boolean) {
  const column = table.getColumn(columnId);
  if (!column) return;
  if (multi) return column.toggleSorting(undefined, true);
  const first = table.getState().sorting[0];
  if (first?.id === columnId) table.setSorting([{ id: columnId, desc: !first.desc }]);
  else table.setSorting([{ id: columnId, desc: column.getFirstSortDir() === 'desc' }]);
}

export interface RankingTableProps {
  table: Table<RankingItem>;
  /** Called when the rows scroll (an open reason would be left pointing at nothing). */
  onScroll?: () => void;
}

/**
 * The ranking from 640 px: a table in its own scroll box, header fixed at the top, and only the
 * rows in view (plus a few either side) in the page, so thousands of lots scroll smoothly.
 */
export function RankingTable({ table, onScroll }: RankingTableProps) {
  const scrollRef = useRef<HTMLDivElement>(null);
  const rows = table.getRowModel().rows;
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Virtual returns fresh functions by design
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 12,
    getItemKey: (index) => rows[index]?.id ?? index,
  });
  const items = virtualizer.getVirtualItems();
  const before = items[0]?.start ?? 0;
  const after = virtualizer.getTotalSize() - (items.at(-1)?.end ?? 0);
  const leafColumns = table.getVisibleLeafColumns();
  const width = leafColumns.reduce((sum, c) => sum + (columnMeta(c)?.width ?? 100), 0);
  // Columns share the box in proportion to their widths; below 85% of the total the box scrolls
  // sideways instead of squeezing them further (a tablet held upright).
  const share = (c: (typeof leafColumns)[number]) => `${(100 * (columnMeta(c)?.width ?? 100)) / width}%`;

  return (
    <div
      ref={scrollRef}
      onScroll={onScroll}
      className="max-h-[70vh] overflow-auto rounded-xl border border-loam-200 bg-white shadow-sm"
      data-ranking-scroll
    >
      <table
        className="w-full table-fixed border-separate border-spacing-0 text-left"
        style={{ minWidth: Math.round(width * 0.85) }}
      >
        <caption className="sr-only">
          Lots ranked by projected germination. Column headers sort the table; the advice opens its reason.
        </caption>
        <colgroup>
          {leafColumns.map((c) => (
            <col key={c.id} style={{ width: share(c) }} />
          ))}
        </colgroup>
        <thead className="sticky top-0 z-10 bg-husk-100 text-sm">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                // Screen readers hear only the first sort; the others break its ties.
                const primary = header.column.getSortIndex() === 0;
                const numeric = columnMeta(header.column)?.numeric;
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={
                      primary && sorted ? (sorted === 'asc' ? 'ascending' : 'descending') : undefined
                    }
                    className={cn(
                      'border-b border-loam-200 px-2 py-1 font-semibold text-loam-800',
                      numeric && 'text-right',
                    )}
                  >
                    {header.column.getCanSort() ? (
                      <button
                        type="button"
                        onClick={(event) => sortBy(table, header.column.id, event.shiftKey)}
                        title="Sort (hold Shift to add a second sort)"
                        className={cn(
                          'inline-flex min-h-11 max-w-full items-center gap-1 rounded px-1 text-left leading-tight hover:bg-husk-200',
                          numeric && 'flex-row-reverse text-right',
                        )}
                      >
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span
                          aria-hidden="true"
                          className={cn('w-3 shrink-0', primary ? 'text-loam-700' : 'text-loam-400')}
                        >
                          {sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : ''}
                        </span>
                      </button>
                    ) : (
                      <span className="flex justify-center">
                        {flexRender(header.column.columnDef.header, header.getContext())}
                      </span>
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {before > 0 ? (
            <tr aria-hidden="true">
              <td colSpan={leafColumns.length} style={{ height: before, padding: 0 }} />
            </tr>
          ) : null}
          {items.map((virtualRow) => {
            const row = rows[virtualRow.index]!;
            return (
              <tr
                key={row.id}
                data-lot={row.original.code}
                className={cn('hover:bg-husk-50', row.getIsSelected() && 'bg-moss-50')}
                style={{ height: ROW_HEIGHT }}
              >
                {row.getVisibleCells().map((cell) => {
                  const numeric = columnMeta(cell.column)?.numeric;
                  return (
                    <td
                      key={cell.id}
                      className={cn(
                        'overflow-hidden border-b border-loam-100 px-2 align-middle',
                        numeric && 'text-right font-semibold',
                        cell.column.id === 'select' && 'text-center',
                      )}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            );
          })}
          {after > 0 ? (
            <tr aria-hidden="true">
              <td colSpan={leafColumns.length} style={{ height: after, padding: 0 }} />
            </tr>
          ) : null}
        </tbody>
      </table>
    </div>
  );
}
