import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReminderPrefs } from '#shared/schemas/reminders';
import { apiFetch } from '#src/lib/api-client';
import { remindersResponseSchema } from './get-reminders';
import { bankKeys, bankPaths } from '#src/lib/bank-api';

/** PATCH /api/banks/:bankId/reminders with the choices that change → the member's full choices. */
export async function updateReminders(bankId: string, body: Partial<ReminderPrefs>) {
  return (
    await apiFetch(bankPaths.reminders(bankId), { method: 'PATCH', body, schema: remindersResponseSchema })
  ).preferences;
}

export function useUpdateReminders(bankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: Partial<ReminderPrefs>) => updateReminders(bankId, body),
    onSuccess: (preferences) => queryClient.setQueryData(bankKeys.reminders(bankId), preferences),
  });
}
