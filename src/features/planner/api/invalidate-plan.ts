import type { QueryClient } from '@tanstack/react-query';
import type { PlanEntryDto } from '../../../../shared/schemas/plan';
import { planKeys } from './keys';

/**
 * After a plan change: the season's list, and — when seeds moved — every lot query (stock, ledger,
 * ranking) and the overview's "sowings due".
 */
export async function refreshAfterPlanChange(
  queryClient: QueryClient,
  bankId: string,
  { stockMoved }: { stockMoved: boolean },
): Promise<void> {
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: planKeys.all(bankId) }),
    queryClient.invalidateQueries({ queryKey: planKeys.overview(bankId) }),
    stockMoved ? queryClient.invalidateQueries({ queryKey: planKeys.lots(bankId) }) : Promise.resolve(),
  ]);
}

/** Puts an entry the server answered with into its season's cached list, in sowing order. */
export function putEntry(queryClient: QueryClient, bankId: string, entry: PlanEntryDto): void {
  queryClient.setQueryData<PlanEntryDto[]>(planKeys.season(bankId, entry.season), (list) => {
    if (!list) return list;
    const others = list.filter((e) => e.id !== entry.id);
    return [...others, entry].sort(
      (a, b) => a.sowFrom.localeCompare(b.sowFrom) || a.speciesName.localeCompare(b.speciesName),
    );
  });
}
