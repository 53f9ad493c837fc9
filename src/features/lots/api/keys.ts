import type { z } from 'zod';
import type { lotStatusSchema } from '../../../../shared/schemas/lots';

export type LotStatus = z.infer<typeof lotStatusSchema>;

export interface LotFilters {
  q?: string | undefined;
  speciesId?: string | undefined;
  status?: LotStatus | undefined;
}

/** Query keys of lots, under the bank's own prefix ['banks', bankId] (see features/banks/api/keys.ts). */
export const lotKeys = {
  all: (bankId: string) => ['banks', bankId, 'lots'] as const,
  lists: (bankId: string) => [...lotKeys.all(bankId), 'list'] as const,
  list: (bankId: string, filters: LotFilters) => [...lotKeys.lists(bankId), filters] as const,
  detail: (bankId: string, lotId: string) => [...lotKeys.all(bankId), 'detail', lotId] as const,
  stock: (bankId: string, lotId: string) => [...lotKeys.detail(bankId, lotId), 'stock'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
export const lotApiPaths = {
  lots: (bankId: string) => `${bankPath(bankId)}/lots`,
  lot: (bankId: string, lotId: string) => `${bankPath(bankId)}/lots/${encodeURIComponent(lotId)}`,
  stock: (bankId: string, lotId: string) => `${lotApiPaths.lot(bankId, lotId)}/stock`,
  csv: (bankId: string) => `${bankPath(bankId)}/lots.csv`,
  import: (bankId: string, dryRun: boolean) => `${bankPath(bankId)}/lots/import${dryRun ? '?dryRun=true' : ''}`,
};
