/** Query keys of parent plants, under the bank's own prefix ['banks', bankId]. */
export const plantKeys = {
  all: (bankId: string) => ['banks', bankId, 'plants'] as const,
  list: (bankId: string) => [...plantKeys.all(bankId), 'list'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const plantApiPaths = {
  plants: (bankId: string) => `${bankPath(bankId)}/plants`,
  plant: (bankId: string, plantId: string) => `${bankPath(bankId)}/plants/${encodeURIComponent(plantId)}`,
};
