import { useQuery } from '@tanstack/react-query';
import { seedsToSowQueryOptions } from '#src/lib/queries/lot-queries';

/** Only asks once there is a lot, a whole number of plants and a sowing day (at the bank's assurance). */
export function useSeedsToSow(bankId: string, lotId: string, plants: number, on: string | undefined) {
  const ready =
    Boolean(lotId) && Number.isInteger(plants) && plants >= 1 && plants <= 100_000 && on !== undefined;
  return useQuery({ ...seedsToSowQueryOptions(bankId, lotId, { plants, on: on ?? '' }), enabled: ready });
}
