import {
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type RowSelectionState,
  type SortingState,
  type Updater,
  type VisibilityState,
} from '@tanstack/react-table';
import { useCallback, useMemo, useState, type ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { RankingItem } from '#shared/schemas/viability';
import { Button } from '#src/components/ui/button';
import { EmptyState } from '#src/components/ui/empty-state';
import { FormAlert } from '#src/components/ui/form-alert';
import { SelectField } from '#src/components/ui/select-field';
import { Loading } from '#src/components/ui/spinner';
import { paths } from '#src/config/paths';
import { formatDay } from '#src/lib/dates';
import { useMediaQuery } from '#src/lib/use-media-query';
import { useRanking } from '../api/get-ranking';
import { RankingCards } from './ranking-cards';
import { rankingColumns } from './ranking-columns';
import { DEFAULT_SORTING, searchFromView, viewFromSearch, type RankingView as View } from './ranking-search';
import { RankingTable } from './ranking-table';
import { ColumnsMenu, RankingToolbar } from './ranking-toolbar';
import { ReasonPopover, type OpenReason } from './reason-popover';
import { defaultSowingDate } from '#src/lib/sowing-date';
import { formatCount } from '#src/components/viability/viability-format';

export interface RankingViewProps {
  bankId: string;
  /** The bank's last spring frost ("MM-DD") and today in its time zone: the default sowing date. */
  lastFrost: string | null;
  today: string;
  /** What to offer for the ticked lots (the route puts the labels page's link here). */
  selectionActions: (lotIds: string[]) => ReactNode;
}

function matches(item: RankingItem, view: View, words: string[]): boolean {
  if (view.speciesId && item.speciesId !== view.speciesId) return false;
  if (view.recommendation && item.recommendation !== view.recommendation) return false;
  if (view.status && item.status !== view.status) return false;
  if (view.origin && item.origin !== view.origin) return false;
  if (words.length) {
    const text = `${item.code} ${item.species} ${item.variety} ${item.sourceName ?? ''}`.toLowerCase();
    if (!words.every((w) => text.includes(w))) return false;
  }
  return true;
}

const phoneSorts: { value: string; label: string; sorting: SortingState }[] = [
  { value: 'best', label: 'Best advice first', sorting: DEFAULT_SORTING },
  { value: 'projected:desc', label: 'Highest projected first', sorting: [{ id: 'projected', desc: true }] },
  { value: 'projected:asc', label: 'Lowest projected first', sorting: [{ id: 'projected', desc: false }] },
  { value: 'code:asc', label: 'Code', sorting: [{ id: 'code', desc: false }] },
  { value: 'species:asc', label: 'Species', sorting: [{ id: 'species', desc: false }] },
  { value: 'age:asc', label: 'Youngest seed first', sorting: [{ id: 'age', desc: false }] },
  { value: 'lastTest:desc', label: 'Latest test first', sorting: [{ id: 'lastTest', desc: true }] },
  { value: 'seeds:desc', label: 'Most seeds first', sorting: [{ id: 'seeds', desc: true }] },
];
const sortValue = (sorting: SortingState) =>
  phoneSorts.find((s) => JSON.stringify(s.sorting) === JSON.stringify(sorting))?.value ?? 'other';

/**
 * The Lots screen's ranking: every lot projected to the sowing date, sortable, filterable and
 * searchable, with the view kept in the address so it can be shared. A table from 640 px, cards
 * below; both render only the rows near the screen.
 */
export function RankingView({ bankId, lastFrost, today, selectionActions }: RankingViewProps) {
  const [search, setSearch] = useSearchParams();
  // The view lives here first and in the address second: a router navigation settles a moment
  // after a tick or a choice, and a box that jumped back meanwhile would lose the press. When the
  // address changes by other means (back, a shared link), the view follows it.
  const searchKey = search.toString();
  const [view, setViewState] = useState<View>(() => viewFromSearch(search));
  const [seenKey, setSeenKey] = useState(searchKey);
  if (searchKey !== seenKey) {
    setSeenKey(searchKey);
    if (searchFromView(view).toString() !== searchKey) setViewState(viewFromSearch(search));
  }
  const setView = useCallback(
    (next: View) => {
      setViewState(next);
      setSearch(searchFromView(next), { replace: true });
    },
    [setSearch],
  );
  const defaultOn = defaultSowingDate(lastFrost, today);
  const on = view.on ?? defaultOn;
  const ranking = useRanking(bankId, on);
  const wide = useMediaQuery('(min-width: 640px)');

  const all = useMemo(() => ranking.data?.items ?? [], [ranking.data]);
  const shown = useMemo(() => {
    const words = (view.q ?? '').toLowerCase().split(/\s+/).filter(Boolean);
    return all.filter((item) => matches(item, view, words));
  }, [all, view]);
  const species = useMemo(() => {
    const names = new Map(all.map((i) => [i.speciesId, i.species]));
    return [...names].map(([id, name]) => ({ id, name })).sort((a, b) => a.name.localeCompare(b.name));
  }, [all]);

  const [selection, setSelection] = useState<RowSelectionState>({});
  const [reason, setReason] = useState<OpenReason | null>(null);
  const closeReason = useCallback(() => setReason(null), []);
  const lotHref = useCallback(
    (lotId: string) =>
      `${paths.lot.getHref(bankId, lotId)}${view.on ? `?${new URLSearchParams({ on: view.on })}` : ''}`,
    [bankId, view.on],
  );
  const columns = useMemo(
    () =>
      rankingColumns({
        lotHref,
        openReason: (item, anchor) => setReason({ item, anchor: anchor.getBoundingClientRect() }),
      }),
    [lotHref],
  );
  const columnVisibility = useMemo<VisibilityState>(
    () => Object.fromEntries(view.hidden.map((id) => [id, false])),
    [view.hidden],
  );
  const onSortingChange = useCallback(
    (updater: Updater<SortingState>) =>
      setView({ ...view, sorting: typeof updater === 'function' ? updater(view.sorting) : updater }),
    [setView, view],
  );

  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design
  const table = useReactTable({
    data: shown,
    columns,
    state: { sorting: view.sorting, columnVisibility, rowSelection: selection },
    getRowId: (row) => row.lotId,
    onSortingChange,
    onRowSelectionChange: setSelection,
    enableMultiSort: true,
    maxMultiSortColCount: 3,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  // Ticked lots stay ticked while filters hide them; only lots still in the ranking count.
  const selectedIds = all.filter((i) => selection[i.lotId]).map((i) => i.lotId);
  const filtered = Boolean(view.q || view.speciesId || view.recommendation || view.status || view.origin);

  let body: ReactNode;
  if (ranking.isPending) {
    body = <Loading label="Ranking the lots" />;
  } else if (ranking.isError) {
    body = (
      <FormAlert title="The ranking could not be loaded">
        <p>{ranking.error.message}</p>
        <Button variant="secondary" className="mt-2" onClick={() => void ranking.refetch()}>
          Try again
        </Button>
      </FormAlert>
    );
  } else if (all.length === 0) {
    body = (
      <EmptyState
        title="No lots to rank"
        description="Only active and used-up lots are ranked; retired lots are left out. Log a lot, or bring a retired one back, to see it here."
      />
    );
  } else if (shown.length === 0) {
    body = (
      <EmptyState
        title="No lots match"
        description="Try another word, or clear the filters."
        action={
          <Button
            variant="secondary"
            onClick={() =>
              setView({
                ...view,
                q: undefined,
                speciesId: undefined,
                recommendation: undefined,
                status: undefined,
                origin: undefined,
              })
            }
          >
            Clear search and filters
          </Button>
        }
      />
    );
  } else if (wide) {
    body = <RankingTable table={table} onScroll={reason ? closeReason : undefined} />;
  } else {
    body = (
      <div className="grid gap-3">
        <SelectField
          label="Sort by"
          value={sortValue(view.sorting)}
          onChange={(event) => {
            const choice = phoneSorts.find((s) => s.value === event.target.value);
            if (choice) setView({ ...view, sorting: choice.sorting });
          }}
        >
          {sortValue(view.sorting) === 'other' ? (
            <option value="other">As chosen on a wider screen</option>
          ) : null}
          {phoneSorts.map((s) => (
            <option key={s.value} value={s.value}>
              {s.label}
            </option>
          ))}
        </SelectField>
        <RankingCards table={table} lotHref={lotHref} />
      </div>
    );
  }

  return (
    <div className="grid gap-4">
      <RankingToolbar view={view} onChange={setView} on={on} defaultOn={defaultOn} species={species} />
      <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
        <p className="text-sm text-loam-700" aria-live="polite">
          {ranking.isSuccess ? (
            <>
              {filtered
                ? `${formatCount(shown.length)} of ${formatCount(all.length)} lots`
                : all.length === 1
                  ? '1 lot'
                  : `${formatCount(all.length)} lots`}
              , projected to <span className="font-semibold text-loam-900">{formatDay(on)}</span>
              {view.on ? '' : ' (the coming sowing date)'}
              {ranking.isPlaceholderData ? ' · updating…' : ''}
            </>
          ) : null}
        </p>
        <div className="flex flex-wrap items-center gap-2">
          {selectedIds.length ? (
            <>
              <span className="text-sm font-semibold text-loam-900">{selectedIds.length} selected</span>
              {selectionActions(selectedIds)}
              <Button variant="quiet" onClick={() => setSelection({})}>
                Clear
              </Button>
            </>
          ) : ranking.isSuccess && all.length ? (
            <span className="text-sm text-loam-700">Tick lots to print their labels.</span>
          ) : null}
          {wide && ranking.isSuccess && all.length ? (
            <ColumnsMenu table={table} view={view} onChange={setView} />
          ) : null}
        </div>
      </div>
      {body}
      <ReasonPopover open={reason} onClose={closeReason} />
    </div>
  );
}
