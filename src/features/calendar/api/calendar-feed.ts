import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { calendarFeedSchema } from '#shared/schemas/calendar';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** GET /api/banks/:bankId/calendar-feed: the member's private feed address (made on first use). */
export async function getCalendarFeed(bankId: string, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(bankPaths.calendarFeed(bankId), { schema: calendarFeedSchema, signal })).url;
}

export function useCalendarFeed(bankId: string) {
  return useQuery({
    queryKey: bankKeys.calendarFeed(bankId),
    queryFn: ({ signal }) => getCalendarFeed(bankId, { signal }),
  });
}

/** POST …/calendar-feed/rotate: a new address; the old one stops working. */
export function useRotateCalendarFeed(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async () =>
      (
        await apiFetch(bankPaths.calendarFeedRotate(bankId), {
          method: 'POST',
          schema: calendarFeedSchema,
        })
      ).url,
    onSuccess: (url) => queryClient.setQueryData(bankKeys.calendarFeed(bankId), url),
  });
}
