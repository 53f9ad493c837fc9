import { z } from 'zod';
import { idSchema } from './common';

export const emailSchema = z
  .string({ message: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }).max(254));

export const passwordSchema = z
  .string({ message: 'Enter a password.' })
  .min(10, { message: 'Use at least 10 characters.' })
  .max(200, { message: 'Use at most 200 characters.' });

export const registerBodySchema = z.object({
  email: emailSchema,
  password: passwordSchema,
  name: z.string({ message: 'Enter your name.' }).trim().min(1, { message: 'Enter your name.' }).max(100),
});
export type RegisterBody = z.infer<typeof registerBodySchema>;

export const loginBodySchema = z.object({
  email: emailSchema,
  password: z
    .string({ message: 'Enter your password.' })
    .min(1, { message: 'Enter your password.' })
    .max(200),
});
export type LoginBody = z.infer<typeof loginBodySchema>;

export const passwordResetBodySchema = z.object({ email: emailSchema });
export const passwordResetConfirmBodySchema = z.object({
  token: z.string().min(10).max(200),
  password: passwordSchema,
});

/** The link from a verification mail. */
export const verifyEmailBodySchema = z.object({ token: z.string().min(10).max(200) });

/** `emailVerified`: the account proved its e-mail address by a link mailed to it. */
export const userSchema = z.object({
  id: idSchema,
  email: z.string(),
  name: z.string(),
  emailVerified: z.boolean(),
});
export type PublicUser = z.infer<typeof userSchema>;

export const roleSchema = z.enum(['owner', 'grower', 'viewer'], {
  message: 'Choose owner, grower or viewer.',
});
export type Role = z.infer<typeof roleSchema>;

export const meResponseSchema = z.object({
  user: userSchema,
  memberships: z.array(z.object({ bankId: idSchema, bankName: z.string(), role: roleSchema })),
});
export type MeResponse = z.infer<typeof meResponseSchema>;
