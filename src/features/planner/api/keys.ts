import { lotQueryKeys } from '../../../lib/queries/lot-queries';

/*
 * Query keys of the season plan, under the bank's own prefix ['banks', bankId] (features/banks).
 * The ranking and seeds to sow it reads are the shared lot queries (src/lib/queries), under the
 * lots prefix: marking a sowing refreshes that prefix, so stock and lot choices follow.
 */
export const planKeys = {
  all: (bankId: string) => ['banks', bankId, 'plan'] as const,
  season: (bankId: string, season: number) => [...planKeys.all(bankId), season] as const,
  lots: lotQueryKeys.lots,
  overview: (bankId: string) => ['banks', bankId, 'overview'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const planApiPaths = {
  plan: (bankId: string) => `${bankPath(bankId)}/plan`,
  season: (bankId: string, season: number) => `${bankPath(bankId)}/plan?season=${season}`,
  entry: (bankId: string, entryId: string) => `${bankPath(bankId)}/plan/${encodeURIComponent(entryId)}`,
  sown: (bankId: string, entryId: string) => `${planApiPaths.entry(bankId, entryId)}/sown`,
  /** The season as an iCalendar file, for a download link ("Add to my calendar"). */
  ics: (bankId: string, season: number) => `${bankPath(bankId)}/plan.ics?season=${season}`,
};
