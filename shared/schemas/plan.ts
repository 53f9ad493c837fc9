import { z } from 'zod';
import { idSchema, isoDateSchema } from './common';

export const seasonSchema = z.coerce.number().int().min(1900).max(2100);
/** `?season=YYYY`: the season asked for; without it, the coming one. */
export const seasonQuerySchema = z.object({ season: seasonSchema.optional() });
export const startSchema = z.enum(['indoors', 'direct'], { message: 'Choose indoors or direct.' });

export const createPlanBodySchema = z.object({
  season: z
    .number()
    .int()
    .min(1900, { message: 'A year like 2027.' })
    .max(2100, { message: 'A year like 2027.' }),
  speciesId: idSchema,
  plantsWanted: z
    .number({ message: 'How many plants?' })
    .int()
    .min(1, { message: 'At least one plant.' })
    .max(100_000),
  start: startSchema,
  lotId: idSchema.nullable().optional(),
});
export type CreatePlanBody = z.infer<typeof createPlanBodySchema>;

export const updatePlanBodySchema = z
  .object({
    plantsWanted: z.number().int().min(1).max(100_000),
    start: startSchema,
    lotId: idSchema.nullable(),
  })
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });

export const sownBodySchema = z.object({ date: isoDateSchema.optional() });

export const planEntrySchema = z.object({
  id: idSchema,
  season: z.number(),
  speciesId: idSchema,
  speciesName: z.string(),
  lotId: idSchema.nullable(),
  lotCode: z.string().nullable(),
  lotChosen: z.boolean(),
  plantsWanted: z.number(),
  start: startSchema,
  seedsToSow: z.number().nullable(),
  /** The chosen or suggested lot's stock now (null without a lot). */
  seedsOnHand: z.number().nullable(),
  sowFrom: z.string(),
  sowTo: z.string(),
  expectFrom: z.string().nullable(),
  expectBy: z.string().nullable(),
  hardenFrom: z.string().nullable(),
  transplantOn: z.string().nullable(),
  notes: z.array(z.string()),
  sownOn: z.string().nullable(),
});
export type PlanEntryDto = z.infer<typeof planEntrySchema>;
export const planListResponseSchema = z.object({
  season: z.number(),
  items: z.array(planEntrySchema),
  nextCursor: z.null(),
});
