/** Query keys of the signed-in member's reminder choices, under the bank's prefix ['banks', bankId]. */
export const reminderKeys = {
  all: (bankId: string) => ['banks', bankId, 'reminders'] as const,
};

export const reminderApiPaths = {
  reminders: (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}/reminders`,
};
