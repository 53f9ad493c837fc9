import { lotStatusSchema } from '#shared/schemas/lots';
import { idSchema } from '#shared/schemas/common';
import type { LotFilters } from '#src/lib/bank-api';

/** The lots page keeps its search and filters in the address, so Back and a shared link keep them. */
export function filtersFromSearch(search: URLSearchParams): LotFilters {
  const q = search.get('q')?.trim();
  const species = idSchema.safeParse(search.get('species'));
  const status = lotStatusSchema.safeParse(search.get('status'));
  return {
    q: q ? q.slice(0, 100) : undefined,
    speciesId: species.success ? species.data : undefined,
    status: status.success ? status.data : undefined,
  };
}

export function searchFromFilters(filters: LotFilters): URLSearchParams {
  const search = new URLSearchParams();
  if (filters.q) search.set('q', filters.q);
  if (filters.speciesId) search.set('species', filters.speciesId);
  if (filters.status) search.set('status', filters.status);
  return search;
}
