/** Query keys of the overview, under the bank's own prefix ['banks', bankId] (see features/banks/api/keys.ts). */
export const overviewKeys = {
  all: (bankId: string) => ['banks', bankId, 'overview'] as const,
  on: (bankId: string, on: string | undefined) => [...overviewKeys.all(bankId), on ?? 'today'] as const,
};

export const overviewApiPaths = {
  overview: (bankId: string, on?: string) =>
    `/api/banks/${encodeURIComponent(bankId)}/overview${on ? `?on=${encodeURIComponent(on)}` : ''}`,
};
