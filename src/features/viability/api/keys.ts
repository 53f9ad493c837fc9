/*
 * Query keys of viability. They sit under the lots feature's layout (written out here, because
 * features do not import each other), so the refreshes that lot and test changes already make
 * reach these too:
 *   ranking             ['banks', bankId, 'lots', 'list', 'ranking', { on }]   (lot lists, all lots)
 *   a lot's decline     ['banks', bankId, 'lots', 'detail', lotId, 'viability', { on }]
 *   seeds to sow        ['banks', bankId, 'lots', 'detail', lotId, 'seeds-to-sow', { … }]
 */
export interface SeedsToSowQuery {
  plants: number;
  assurance: number;
  on: string;
}

export const viabilityKeys = {
  lots: (bankId: string) => ['banks', bankId, 'lots'] as const,
  rankings: (bankId: string) => [...viabilityKeys.lots(bankId), 'list', 'ranking'] as const,
  ranking: (bankId: string, on: string) => [...viabilityKeys.rankings(bankId), { on }] as const,
  lot: (bankId: string, lotId: string) => [...viabilityKeys.lots(bankId), 'detail', lotId] as const,
  decline: (bankId: string, lotId: string, on: string) => [...viabilityKeys.lot(bankId, lotId), 'viability', { on }] as const,
  seedsToSow: (bankId: string, lotId: string, query: SeedsToSowQuery) =>
    [...viabilityKeys.lot(bankId, lotId), 'seeds-to-sow', query] as const,
  /** The planner's entries and the overview's sowings due (those features' prefixes, written out). */
  plan: (bankId: string) => ['banks', bankId, 'plan'] as const,
  overview: (bankId: string) => ['banks', bankId, 'overview'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
const lotPath = (bankId: string, lotId: string) => `${bankPath(bankId)}/lots/${encodeURIComponent(lotId)}`;

export const viabilityApiPaths = {
  ranking: (bankId: string, on: string) => `${bankPath(bankId)}/ranking?${new URLSearchParams({ on })}`,
  decline: (bankId: string, lotId: string, on: string) => `${lotPath(bankId, lotId)}/viability?${new URLSearchParams({ on })}`,
  seedsToSow: (bankId: string, lotId: string, q: SeedsToSowQuery) =>
    `${lotPath(bankId, lotId)}/seeds-to-sow?${new URLSearchParams({ plants: String(q.plants), assurance: String(q.assurance), on: q.on })}`,
  plan: (bankId: string) => `${bankPath(bankId)}/plan`,
};
