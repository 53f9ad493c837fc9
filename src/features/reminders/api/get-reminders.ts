import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { reminderPrefsSchema } from '#shared/schemas/reminders';
import { apiFetch } from '#src/lib/api-client';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

export const remindersResponseSchema = z.object({ preferences: reminderPrefsSchema });

/** GET /api/banks/:bankId/reminders: the signed-in member's own choices in that bank (any role). */
export async function getReminders(bankId: string, { signal }: { signal?: AbortSignal } = {}) {
  return (await apiFetch(bankPaths.reminders(bankId), { schema: remindersResponseSchema, signal }))
    .preferences;
}

export function remindersQueryOptions(bankId: string) {
  return queryOptions({
    queryKey: bankKeys.reminders(bankId),
    queryFn: ({ signal }) => getReminders(bankId, { signal }),
  });
}

/** The choices of a page whose loader has fetched them. */
export function useReminders(bankId: string) {
  return useSuspenseQuery(remindersQueryOptions(bankId));
}
