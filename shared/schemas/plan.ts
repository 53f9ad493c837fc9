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

/** What came up, scored roughly when counting is hopeless: none, a few, about half, most. */
export const emergenceScoreSchema = z.enum(['none', 'few', 'half', 'most'], {
  message: 'Choose none, a few, about half or most.',
});
export type EmergenceScore = z.infer<typeof emergenceScoreSchema>;

/** POST …/plan/:entryId/emergence: the seedlings that came up from a sowing by `date`, counted or scored. */
export const emergenceBodySchema = z
  .object({
    date: isoDateSchema,
    seedlings: z
      .number({ message: 'How many seedlings came up?' })
      .int({ message: 'A whole number of seedlings.' })
      .min(0, { message: 'No fewer than none.' })
      .max(1_000_000, { message: 'Too many seedlings.' })
      .nullish(),
    score: emergenceScoreSchema.nullish(),
  })
  .superRefine((b, ctx) => {
    const counted = b.seedlings !== undefined && b.seedlings !== null;
    const scored = b.score !== undefined && b.score !== null;
    if (counted && scored)
      ctx.addIssue({ code: 'custom', path: ['score'], message: 'Give a count or a rough score, not both.' });
    if (!counted && !scored)
      ctx.addIssue({
        code: 'custom',
        path: ['seedlings'],
        message: 'Give the seedlings counted, or a rough score.',
      });
  });
export type EmergenceBody = z.infer<typeof emergenceBodySchema>;

/**
 * One record of what came up from a sowing. A sowing may be looked at again later: every record is
 * kept, and the latest (by date, then by when it was written) is what came up — the one the lot's
 * viability reads (`latest`).
 */
export const emergenceRecordSchema = z.object({
  id: idSchema,
  /** The day the seedlings were counted or scored. */
  date: z.string(),
  seedlings: z.number().nullable(),
  score: emergenceScoreSchema.nullable(),
  /** The sowing: its day and the seeds its stock movement took from the lot. */
  sownOn: z.string(),
  seedsSown: z.number(),
  /** Seedlings as a percentage of the seeds sown (field emergence), when counted. */
  percent: z.number().nullable(),
  latest: z.boolean(),
});
export type EmergenceRecordDto = z.infer<typeof emergenceRecordSchema>;

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
  /** What came up from the sowing, oldest first (empty until recorded). */
  emergence: z.array(emergenceRecordSchema),
});
export type PlanEntryDto = z.infer<typeof planEntrySchema>;
export const planListResponseSchema = z.object({
  season: z.number(),
  items: z.array(planEntrySchema),
  nextCursor: z.null(),
});
export const emergenceResponseSchema = z.object({
  entry: planEntrySchema,
  emergence: emergenceRecordSchema,
});
