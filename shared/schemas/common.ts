import { z } from 'zod';

export const idSchema = z.uuid({ message: 'Not a valid id.' });

/** An ISO calendar date, YYYY-MM-DD, that exists. */
export const isoDateSchema = z.iso.date({ message: 'Use a date like 2026-05-24.' });

/** `?on=YYYY-MM-DD`: the day an answer is for; without it, today on the bank's calendar. */
export const onQuerySchema = z.object({ on: isoDateSchema.optional() });

/** `?dryRun=true` on a CSV import: check the file and preview it, write nothing. */
export const csvImportQuerySchema = z.object({ dryRun: z.stringbool().default(false) });

const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** A month and day, MM-DD (frost dates recur each year, so no year). */
export const monthDaySchema = z
  .string()
  .regex(/^(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/, { message: 'Use month-day, like 05-24.' })
  .refine((v) => Number(v.slice(3)) <= (DAYS_IN_MONTH[Number(v.slice(0, 2)) - 1] ?? 0), {
    message: 'That day does not exist in that month.',
  });

export const errorResponseSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
    rows: z
      .array(z.object({ line: z.number(), column: z.string().optional(), message: z.string() }))
      .optional(),
  }),
});
export type ErrorResponse = z.infer<typeof errorResponseSchema>;
