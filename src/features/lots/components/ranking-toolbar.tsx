import type { Table } from '@tanstack/react-table';
import { useEffect, useRef, useState } from 'react';
import type { RankingItem } from '#shared/schemas/viability';
import { SelectField } from '#src/components/ui/select-field';
import { TextField } from '#src/components/ui/text-field';
import { cn } from '#src/lib/cn';
import { columnMeta } from './ranking-columns';
import { rankingStatusSchema, type RankingColumnId, type RankingView } from './ranking-search';
import { recommendationLabels, recommendationOrder } from '#src/components/viability/viability-format';
import { originSchema } from '#shared/schemas/lots';
import { recommendationSchema } from '#shared/schemas/viability';

export interface RankingToolbarProps {
  view: RankingView;
  onChange: (view: RankingView) => void;
  /** The sowing date in use (the view's, or the default). */
  on: string;
  defaultOn: string;
  species: ReadonlyArray<{ id: string; name: string }>;
}

/** Sowing date, search and filters above the ranking; the search waits for a pause in typing. */
export function RankingToolbar({ view, onChange, on, defaultOn, species }: RankingToolbarProps) {
  const [q, setQ] = useState(view.q ?? '');
  // Cleared from outside ("Clear filters") empties the box too; typing is never overwritten.
  const [seenQ, setSeenQ] = useState(view.q);
  if (view.q !== seenQ) {
    setSeenQ(view.q);
    if (!view.q) setQ('');
  }
  useEffect(() => {
    const trimmed = q.trim();
    if (trimmed === (view.q ?? '')) return;
    const timer = setTimeout(() => onChange({ ...view, q: trimmed || undefined }), 300);
    return () => clearTimeout(timer);
  }, [q, view, onChange]);
  // On a phone the filters fold behind one button so that the lots start in the first screen.
  const [filtersOpen, setFiltersOpen] = useState(false);
  const filtersSet = [view.speciesId, view.recommendation, view.status, view.origin, view.on].filter(
    (v) => v !== undefined,
  ).length;

  return (
    <form
      role="search"
      aria-label="Find lots"
      onSubmit={(event) => {
        event.preventDefault();
        onChange({ ...view, q: q.trim() || undefined });
      }}
      className="grid grid-cols-2 gap-3 md:grid-cols-3 lg:grid-cols-[minmax(0,1.4fr)_repeat(5,minmax(0,1fr))]"
    >
      <TextField
        label="Search"
        containerClassName="col-span-2 md:col-span-3 lg:col-span-1"
        type="search"
        placeholder="Code, variety, source…"
        value={q}
        onChange={(event) => setQ(event.target.value)}
      />
      <button
        type="button"
        aria-expanded={filtersOpen}
        aria-controls="ranking-filters"
        onClick={() => setFiltersOpen((o) => !o)}
        className="col-span-2 inline-flex min-h-11 items-center justify-between gap-2 rounded-lg border border-loam-300 bg-white px-3 font-semibold text-loam-900 hover:bg-husk-100 md:hidden"
      >
        <span>
          Filters and sowing date
          {filtersSet ? <span className="font-normal text-loam-700"> ({filtersSet} set)</span> : null}
        </span>
        <span aria-hidden="true" className="text-loam-600">
          {filtersOpen ? '▴' : '▾'}
        </span>
      </button>
      <div id="ranking-filters" className={cn(filtersOpen ? 'contents' : 'hidden md:contents')}>
        <SelectField
          label="Species"
          value={view.speciesId ?? ''}
          onChange={(event) => onChange({ ...view, speciesId: event.target.value || undefined })}
        >
          <option value="">All species</option>
          {species.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Advice"
          value={view.recommendation ?? ''}
          onChange={(event) =>
            onChange({ ...view, recommendation: recommendationSchema.safeParse(event.target.value).data })
          }
        >
          <option value="">Any advice</option>
          {recommendationOrder.map((r) => (
            <option key={r} value={r}>
              {recommendationLabels[r]}
            </option>
          ))}
        </SelectField>
        <SelectField
          label="Status"
          value={view.status ?? ''}
          onChange={(event) =>
            onChange({ ...view, status: rankingStatusSchema.safeParse(event.target.value).data })
          }
        >
          <option value="">Any status</option>
          <option value="active">Active</option>
          <option value="depleted">Used up</option>
        </SelectField>
        <SelectField
          label="Origin"
          value={view.origin ?? ''}
          onChange={(event) => onChange({ ...view, origin: originSchema.safeParse(event.target.value).data })}
        >
          <option value="">Any origin</option>
          <option value="saved">Saved</option>
          <option value="swapped">Swapped</option>
          <option value="bought">Bought</option>
        </SelectField>
        <TextField
          label="Sowing date"
          type="date"
          required={false}
          value={on}
          onChange={(event) => {
            const value = event.target.value;
            // An emptied date field goes back to the coming sowing date.
            onChange({ ...view, on: value && value !== defaultOn ? value : undefined });
          }}
        />
      </div>
    </form>
  );
}

/** The columns the table shows, as a panel of checkboxes behind a button. */
export function ColumnsMenu({
  table,
  view,
  onChange,
}: {
  table: Table<RankingItem>;
  view: RankingView;
  onChange: (view: RankingView) => void;
}) {
  // Its own open state, not the shell's disclosure (which closes when the address changes): each
  // tick rewrites the address, and the panel should stay open for the next one.
  const [open, setOpen] = useState(false);
  const rootRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    if (!open) return;
    const onPointerDown = (event: PointerEvent) => {
      if (rootRef.current && !rootRef.current.contains(event.target as Node)) setOpen(false);
    };
    const onKeyDown = (event: KeyboardEvent) => {
      if (event.key !== 'Escape') return;
      setOpen(false);
      buttonRef.current?.focus();
    };
    document.addEventListener('pointerdown', onPointerDown);
    document.addEventListener('keydown', onKeyDown);
    return () => {
      document.removeEventListener('pointerdown', onPointerDown);
      document.removeEventListener('keydown', onKeyDown);
    };
  }, [open]);
  const hideable = table.getAllLeafColumns().filter((c) => c.getCanHide());
  return (
    <div ref={rootRef} className="relative">
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls="ranking-columns-panel"
        onClick={() => setOpen(!open)}
        className="inline-flex min-h-11 items-center gap-1.5 rounded-lg border border-loam-300 bg-white px-3 font-semibold text-loam-900 hover:bg-husk-100"
      >
        Columns
        {view.hidden.length ? (
          <span className="text-sm font-normal text-loam-700">({view.hidden.length} hidden)</span>
        ) : null}
        <span aria-hidden="true" className="text-loam-600">
          ▾
        </span>
      </button>
      <div
        id="ranking-columns-panel"
        hidden={!open}
        className="absolute right-0 z-20 mt-1 w-56 rounded-xl border border-loam-200 bg-white p-2 shadow-lg shadow-loam-900/10"
      >
        <fieldset>
          <legend className="px-2 pb-1 text-sm font-semibold text-loam-700">Show columns</legend>
          {hideable.map((c) => {
            const id = c.id as RankingColumnId;
            return (
              <label key={c.id} className="flex min-h-10 items-center gap-2 rounded px-2 hover:bg-husk-50">
                <input
                  type="checkbox"
                  className="size-4 accent-moss-700"
                  checked={!view.hidden.includes(id)}
                  onChange={(event) =>
                    onChange({
                      ...view,
                      hidden: event.target.checked
                        ? view.hidden.filter((h) => h !== id)
                        : [...view.hidden, id],
                    })
                  }
                />
                {columnMeta(c)?.label ?? c.id}
              </label>
            );
          })}
        </fieldset>
      </div>
    </div>
  );
}
