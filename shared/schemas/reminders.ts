import { z } from 'zod';

export const reminderPrefsSchema = z.object({
  /** The morning a planned sowing window opens. */
  sowing: z.boolean(),
  /** Each check day of a running germination test. */
  checks: z.boolean(),
  /** When a lot is due for a retest. */
  retest: z.boolean(),
  /** A Monday mail of what is due that week. */
  digest: z.boolean(),
});
export type ReminderPrefs = z.infer<typeof reminderPrefsSchema>;
export const reminderPrefsBodySchema = reminderPrefsSchema
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });
