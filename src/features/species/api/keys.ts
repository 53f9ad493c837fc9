/** Query keys of a bank's species list (reference species with the bank's own values over them). */
export const speciesKeys = {
  all: (bankId: string) => ['banks', bankId, 'species'] as const,
  list: (bankId: string) => [...speciesKeys.all(bankId), 'list'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const speciesApiPaths = {
  list: (bankId: string) => `${bankPath(bankId)}/species`,
  one: (bankId: string, speciesId: string) => `${bankPath(bankId)}/species/${encodeURIComponent(speciesId)}`,
  overrides: (bankId: string, speciesId: string) =>
    `${bankPath(bankId)}/species/${encodeURIComponent(speciesId)}/overrides`,
};
