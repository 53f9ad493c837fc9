/*
 * Query keys of the season plan, under the bank's own prefix ['banks', bankId] (features/banks).
 * The ranking and seeds to sow sit under the lots prefix ['banks', bankId, 'lots'] (the lots
 * feature's layout, written out here because features do not import each other), so a change of
 * stock or a new test anywhere refreshes the lot choices and retest dates too.
 */
export const planKeys = {
  all: (bankId: string) => ['banks', bankId, 'plan'] as const,
  season: (bankId: string, season: number) => [...planKeys.all(bankId), season] as const,
  lots: (bankId: string) => ['banks', bankId, 'lots'] as const,
  /** The same key and answer as the lots area's ranking, so both read one cached copy. */
  ranking: (bankId: string, on: string) => [...planKeys.lots(bankId), 'list', 'ranking', { on }] as const,
  seedsToSow: (bankId: string, lotId: string, plants: number, on: string) =>
    [...planKeys.lots(bankId), 'detail', lotId, 'seeds-to-sow', { plants, on }] as const,
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
  ranking: (bankId: string, on: string) => `${bankPath(bankId)}/ranking?on=${encodeURIComponent(on)}`,
  seedsToSow: (bankId: string, lotId: string, plants: number, on: string) =>
    `${bankPath(bankId)}/lots/${encodeURIComponent(lotId)}/seeds-to-sow?plants=${plants}&on=${encodeURIComponent(on)}`,
};
