import type { SortingState } from '@tanstack/react-table';
import { z } from 'zod';
import { idSchema } from '#shared/schemas/common';
import { originSchema } from '#shared/schemas/lots';
import { recommendationSchema, type RecommendationValue } from '#shared/schemas/viability';
import { parseSowingDate } from '#src/lib/sowing-date';

/** The ranking's columns, by the ids the address uses. */
export const rankingColumnIds = [
  'code',
  'species',
  'variety',
  'age',
  'lastTest',
  'lastPercent',
  'projected',
  'meanDays',
  'seeds',
  'recommendation',
] as const;
export type RankingColumnId = (typeof rankingColumnIds)[number];
const columnIdSchema = z.enum(rankingColumnIds);

export const rankingStatusSchema = z.enum(['active', 'depleted']);
export type RankingStatus = z.infer<typeof rankingStatusSchema>;

/** What a shared link of the ranking carries: the sowing date, search, filters, sort and hidden columns. */
export interface RankingView {
  on: string | undefined;
  q: string | undefined;
  speciesId: string | undefined;
  recommendation: RecommendationValue | undefined;
  status: RankingStatus | undefined;
  origin: z.infer<typeof originSchema> | undefined;
  sorting: SortingState;
  hidden: RankingColumnId[];
}

/** Best advice first, then the highest projected germination within each. */
export const DEFAULT_SORTING: SortingState = [
  { id: 'recommendation', desc: false },
  { id: 'projected', desc: true },
];

const sortPart = z.tuple([columnIdSchema, z.enum(['asc', 'desc'])]);

function parseSorting(value: string | null): SortingState {
  if (value === null) return DEFAULT_SORTING;
  if (value === '') return [];
  const out: SortingState = [];
  for (const part of value.split(',').slice(0, 3)) {
    const parsed = sortPart.safeParse(part.split(':'));
    if (parsed.success && !out.some((s) => s.id === parsed.data[0]))
      out.push({ id: parsed.data[0], desc: parsed.data[1] === 'desc' });
  }
  return out.length ? out : DEFAULT_SORTING;
}

const sortingText = (sorting: SortingState) =>
  sorting.map((s) => `${s.id}:${s.desc ? 'desc' : 'asc'}`).join(',');

export function viewFromSearch(search: URLSearchParams): RankingView {
  const q = search.get('q')?.trim();
  const hidden = (search.get('hide') ?? '')
    .split(',')
    .map((id) => columnIdSchema.safeParse(id))
    .flatMap((r) => (r.success && r.data !== 'code' ? [r.data] : []));
  return {
    on: parseSowingDate(search.get('on')),
    q: q ? q.slice(0, 100) : undefined,
    speciesId: idSchema.safeParse(search.get('species')).data,
    recommendation: recommendationSchema.safeParse(search.get('rec')).data,
    status: rankingStatusSchema.safeParse(search.get('status')).data,
    origin: originSchema.safeParse(search.get('origin')).data,
    sorting: parseSorting(search.get('sort')),
    hidden: [...new Set(hidden)],
  };
}

/** The address for a view; defaults are left out so a plain link stays plain. */
export function searchFromView(view: RankingView): URLSearchParams {
  const search = new URLSearchParams();
  if (view.on) search.set('on', view.on);
  if (view.q) search.set('q', view.q);
  if (view.speciesId) search.set('species', view.speciesId);
  if (view.recommendation) search.set('rec', view.recommendation);
  if (view.status) search.set('status', view.status);
  if (view.origin) search.set('origin', view.origin);
  const sort = sortingText(view.sorting);
  if (sort !== sortingText(DEFAULT_SORTING)) search.set('sort', sort);
  if (view.hidden.length) search.set('hide', view.hidden.join(','));
  return search;
}
