import { useEffect, useState } from 'react';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import type { LotFilters, LotStatus } from '../api/keys';
import { statusLabels, statusOrder } from './lot-format';

export interface LotsFiltersProps {
  filters: LotFilters;
  onChange: (filters: LotFilters) => void;
  /** The species to filter by (the bank's list, by common name). */
  species: ReadonlyArray<{ id: string; commonName: string }>;
}

/** Search and filters above the lots table; the search waits for a pause in typing. */
export function LotsFilters({ filters, onChange, species }: LotsFiltersProps) {
  const [q, setQ] = useState(filters.q ?? '');
  // Filters cleared from outside (the "clear" button) empty the box too; typing is never overwritten.
  const [seenQ, setSeenQ] = useState(filters.q);
  if (filters.q !== seenQ) {
    setSeenQ(filters.q);
    if (!filters.q) setQ('');
  }
  useEffect(() => {
    const trimmed = q.trim();
    if (trimmed === (filters.q ?? '')) return;
    const timer = setTimeout(() => onChange({ ...filters, q: trimmed || undefined }), 300);
    return () => clearTimeout(timer);
  }, [q, filters, onChange]);

  return (
    <form
      role="search"
      aria-label="Find lots"
      onSubmit={(event) => {
        event.preventDefault();
        onChange({ ...filters, q: q.trim() || undefined });
      }}
      className="grid grid-cols-2 gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]"
    >
      <TextField
        label="Search"
        containerClassName="col-span-2 sm:col-span-1"
        type="search"
        placeholder="Code, variety or species"
        value={q}
        onChange={(event) => setQ(event.target.value)}
      />
      <SelectField
        label="Species"
        value={filters.speciesId ?? ''}
        onChange={(event) => onChange({ ...filters, speciesId: event.target.value || undefined })}
      >
        <option value="">All species</option>
        {species.map((s) => (
          <option key={s.id} value={s.id}>
            {s.commonName}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Status"
        value={filters.status ?? ''}
        onChange={(event) => onChange({ ...filters, status: (event.target.value || undefined) as LotStatus | undefined })}
      >
        <option value="">Any status</option>
        {statusOrder.map((status) => (
          <option key={status} value={status}>
            {statusLabels[status]}
          </option>
        ))}
      </SelectField>
    </form>
  );
}
