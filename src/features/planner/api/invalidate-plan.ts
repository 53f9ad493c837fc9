import type { QueryClient } from '@tanstack/react-query';
import type { PlanEntryDto } from '#shared/schemas/plan';
import { bankKeys, refresh, stale } from '#src/lib/bank-api';
import type { PlanList } from './get-plan';

/**
 * After a plan change: the season's entries and the overview's sowings due, and — when the entry's
 * seeds left or went back into its lot — that lot's stock wherever it shows.
 */
export async function refreshAfterPlanChange(
  queryClient: QueryClient,
  bankId: string,
  entry: Pick<PlanEntryDto, 'lotId'>,
  { stockMoved }: { stockMoved: boolean },
): Promise<void> {
  await refresh(
    queryClient,
    stale.plan(bankId),
    stockMoved && entry.lotId ? stale.stockMoved(bankId, entry.lotId) : [],
  );
}

/** Puts an entry the server answered with into its season's cached list, in sowing order. */
export function putEntry(queryClient: QueryClient, bankId: string, entry: PlanEntryDto): void {
  queryClient.setQueryData<PlanList>(bankKeys.planSeason(bankId, entry.season), (plan) => {
    if (!plan) return plan;
    const others = plan.items.filter((e) => e.id !== entry.id);
    const items = [...others, entry].sort(
      (a, b) => a.sowFrom.localeCompare(b.sowFrom) || a.speciesName.localeCompare(b.speciesName),
    );
    return { ...plan, items };
  });
}
