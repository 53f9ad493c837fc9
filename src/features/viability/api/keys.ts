import { lotQueryKeys } from '../../../lib/queries/lot-queries';

/*
 * Query keys of viability, under the lots feature's layout (the shared lot queries' keys), so the
 * refreshes that lot and test changes already make reach these too:
 *   ranking             ['banks', bankId, 'lots', 'list', 'ranking', { on }]   (src/lib/queries)
 *   a lot's decline     ['banks', bankId, 'lots', 'detail', lotId, 'viability', { on }]
 *   seeds to sow        ['banks', bankId, 'lots', 'detail', lotId, 'seeds-to-sow', { … }]   (src/lib/queries)
 */
export const viabilityKeys = {
  decline: (bankId: string, lotId: string, on: string) => [...lotQueryKeys.lot(bankId, lotId), 'viability', { on }] as const,
  /** The planner's entries and the overview's sowings due (those features' prefixes, written out). */
  plan: (bankId: string) => ['banks', bankId, 'plan'] as const,
  overview: (bankId: string) => ['banks', bankId, 'overview'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
const lotPath = (bankId: string, lotId: string) => `${bankPath(bankId)}/lots/${encodeURIComponent(lotId)}`;

export const viabilityApiPaths = {
  decline: (bankId: string, lotId: string, on: string) => `${lotPath(bankId, lotId)}/viability?${new URLSearchParams({ on })}`,
  plan: (bankId: string) => `${bankPath(bankId)}/plan`,
};
