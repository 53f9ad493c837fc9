import { z } from 'zod';

/** The local hour reminders go out from unless a member chooses another (the bank's time zone). */
export const DEFAULT_REMINDER_HOUR = 7;

/** A local hour of the day, 0–23, in the bank's time zone. */
export const reminderHourSchema = z
  .number({ message: 'Give the hour as a whole number from 0 to 23.' })
  .int({ message: 'Give the hour as a whole number from 0 to 23.' })
  .min(0, { message: 'Give the hour as a whole number from 0 to 23.' })
  .max(23, { message: 'Give the hour as a whole number from 0 to 23.' })
  .meta({
    description:
      "The hour of the day (0–23, on the bank's clock, in its time zone) from which this member's reminders go out; 7 unless chosen.",
  });

export const reminderPrefsSchema = z.object({
  /** The day a planned sowing window opens. */
  sowing: z.boolean(),
  /** Each check day of a running germination test the member runs. */
  checks: z.boolean(),
  /** When a lot is due for a retest. */
  retest: z.boolean(),
  /** A Monday mail of what is due that week. */
  digest: z.boolean(),
  /** The local hour every reminder of this member goes out from. */
  hour: reminderHourSchema,
});
export type ReminderPrefs = z.infer<typeof reminderPrefsSchema>;
export const reminderPrefsBodySchema = reminderPrefsSchema
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });

/** An hour of the day in words, as the screens and the mail say it: "7 a.m.", "noon", "midnight". */
export function hourWords(hour: number): string {
  if (hour === 0) return 'midnight';
  if (hour === 12) return 'noon';
  return hour < 12 ? `${hour} a.m.` : `${hour - 12} p.m.`;
}
