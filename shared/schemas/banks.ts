import { z } from 'zod';
import { emailSchema, roleSchema } from './accounts';
import { idSchema, monthDaySchema } from './common';
import { planMoveSchema } from './plan-move';

const bankName = z
  .string({ message: 'Name the bank.' })
  .trim()
  .min(1, { message: 'Name the bank.' })
  .max(120);
/** An IANA time zone name the runtime knows: the bank's calendar for "today". */
const timeZoneSchema = z.string().refine(
  (tz) => {
    try {
      new Intl.DateTimeFormat('en', { timeZone: tz });
      return true;
    } catch {
      return false;
    }
  },
  { message: 'Not a known time zone (e.g. America/Chicago, Europe/Oslo).' },
);

export const createBankBodySchema = z.object({
  name: bankName,
  lastFrost: monthDaySchema.optional(),
  firstFrost: monthDaySchema.optional(),
  /** The creator's own zone, as their browser gives it; UTC when left out. */
  timeZone: timeZoneSchema.optional(),
});
export type CreateBankBody = z.infer<typeof createBankBodySchema>;

export const updateBankBodySchema = z
  .object({
    name: bankName,
    lastFrost: monthDaySchema.nullable(),
    firstFrost: monthDaySchema.nullable(),
    frostMarginDays: z
      .number({ message: 'Enter a whole number of days from 0 to 60.' })
      .int({ message: 'Enter a whole number of days from 0 to 60.' })
      .min(0, { message: 'Enter a whole number of days from 0 to 60.' })
      .max(60, { message: 'Enter a whole number of days from 0 to 60.' }),
    sowThresholdPercent: z
      .number()
      .int()
      .min(1, { message: 'Between 1 and 100.' })
      .max(100, { message: 'Between 1 and 100.' }),
    establishmentFactor: z
      .number()
      .gt(0, { message: 'Above 0 and at most 1.' })
      .max(1, { message: 'Above 0 and at most 1.' }),
    sowingAssurance: z
      .number()
      .gt(0.5, { message: 'Between 0.5 and 0.99.' })
      .max(0.99, { message: 'Between 0.5 and 0.99.' }),
    timeZone: timeZoneSchema,
  })
  .partial()
  .refine((body) => Object.keys(body).length > 0, { message: 'Nothing to change.' });
export type UpdateBankBody = z.infer<typeof updateBankBodySchema>;

export const bankSchema = z.object({
  id: idSchema,
  name: z.string(),
  lastFrost: z.string().nullable(),
  firstFrost: z.string().nullable(),
  frostMarginDays: z.number(),
  timeZone: z.string(),
  sowThresholdPercent: z.number(),
  establishmentFactor: z.number(),
  sowingAssurance: z.number(),
  createdAt: z.string(),
});
export type BankDto = z.infer<typeof bankSchema>;

export const bankResponseSchema = z.object({ bank: bankSchema, role: roleSchema });
/** PATCH /api/banks/:bankId: the bank, and what a moved last frost did to each season's unsown sowings. */
export const bankUpdateResponseSchema = bankResponseSchema.extend({ planMoved: z.array(planMoveSchema) });

export const memberSchema = z.object({
  userId: idSchema,
  name: z.string(),
  email: z.string(),
  role: roleSchema,
});
export type Member = z.infer<typeof memberSchema>;
export const membersResponseSchema = z.object({ items: z.array(memberSchema) });

export const updateMemberBodySchema = z.object({ role: roleSchema });

export const createInvitationBodySchema = z.object({ email: emailSchema, role: roleSchema });
export type CreateInvitationBody = z.infer<typeof createInvitationBodySchema>;

/**
 * The state of an invitation's latest mail: `waiting` to be sent, `sent` (the mail server took
 * it), `retrying` after a failed try (it is tried again, later each time), `unknown` for an
 * invitation older than the mail queue.
 */
export const invitationMailStateSchema = z.enum(['waiting', 'sent', 'retrying', 'unknown']);
export type InvitationMailState = z.infer<typeof invitationMailStateSchema>;

export const invitationSchema = z.object({
  id: idSchema,
  email: z.string(),
  role: roleSchema,
  invitedBy: z.string().nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
  mailState: invitationMailStateSchema,
});
export type InvitationDto = z.infer<typeof invitationSchema>;
export const invitationsResponseSchema = z.object({ items: z.array(invitationSchema) });

export const acceptInvitationBodySchema = z.object({ token: z.string().min(10).max(200) });
export const acceptInvitationResponseSchema = z.object({
  bankId: idSchema,
  role: roleSchema,
  bankName: z.string(),
});
