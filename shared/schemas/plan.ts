import { z } from 'zod';
import { idSchema, isoDateSchema } from './common';
import { planMoveSchema } from './plan-move';
import { hardinessSchema } from './species';

export { planMoveSchema, type PlanMoveDto } from './plan-move';

export const seasonSchema = z.coerce.number().int().min(1900).max(2100);
/** `?season=YYYY`: the season asked for; without it, the coming one. */
export const seasonQuerySchema = z.object({ season: seasonSchema.optional() });
export const startSchema = z.enum(['indoors', 'direct'], { message: 'Choose indoors or direct.' });

/**
 * Succession sowings: `sowings` sowings of the crop, each `everyWeeks` weeks after the one before
 * (lettuce: 4 sowings every 2 weeks). Each is an entry of its own, with its own dates and seeds.
 */
export const successionBodySchema = z.object({
  sowings: z
    .number({ message: 'How many sowings?' })
    .int({ message: 'A whole number of sowings.' })
    .min(2, { message: 'A succession is at least 2 sowings.' })
    .max(12, { message: 'At most 12 sowings.' }),
  everyWeeks: z
    .number({ message: 'How many weeks between sowings?' })
    .int({ message: 'A whole number of weeks.' })
    .min(1, { message: 'At least 1 week apart.' })
    .max(8, { message: 'At most 8 weeks apart.' }),
});

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
  succession: successionBodySchema.optional(),
  /** A sowing for seed (a biennial's then runs over two seasons). */
  forSeed: z.boolean({ message: 'forSeed is true or false.' }).optional(),
});
export type CreatePlanBody = z.infer<typeof createPlanBodySchema>;

export const updatePlanBodySchema = z
  .object({
    plantsWanted: z.number().int().min(1).max(100_000),
    start: startSchema,
    lotId: idSchema.nullable(),
    forSeed: z.boolean({ message: 'forSeed is true or false.' }),
  })
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });

/**
 * POST …/plan/:entryId/sown: the day it was sown, always chosen (no silent today). A day outside
 * the sowing window is recorded only with `confirm: true` (else 409 `outside_window`).
 */
export const sownBodySchema = z.object({
  date: z.iso.date({
    error: (issue) =>
      issue.input === undefined ? 'Choose the day it was sown.' : 'Use a date like 2026-05-24.',
  }),
  confirm: z.boolean({ message: 'confirm is true or false.' }).optional(),
});
export type SownBody = z.infer<typeof sownBodySchema>;

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
  /** The species' cold hardiness the dates were planned with (null: not set, planned as tender). */
  hardiness: hardinessSchema.nullable(),
  /** One sowing of a succession: its number (from 1), how many there are now, the weeks between. */
  succession: z
    .object({ id: idSchema, number: z.number(), of: z.number(), everyWeeks: z.number() })
    .nullable(),
  /** What came up from the sowing, oldest first (empty until recorded). */
  emergence: z.array(emergenceRecordSchema),
  // A sowing for seed (server/modules/plan/plan-live.ts works the dates out).
  forSeed: z.boolean(),
  /** The season its seed is harvested in: this one, or the next for a biennial; null when not for seed. */
  seedSeason: z.number().nullable(),
  /** A biennial for seed is kept through the winter: first autumn frost → last spring frost. */
  overwinterFrom: z.string().nullable(),
  overwinterTo: z.string().nullable(),
});
export type PlanEntryDto = z.infer<typeof planEntrySchema>;

export const planListResponseSchema = z.object({
  season: z.number(),
  items: z.array(planEntrySchema),
  nextCursor: z.null(),
  /** The latest frost-date move of this season's plan, or null. */
  moved: planMoveSchema.nullable(),
});
/** 201 of POST …/plan: `entry` is the (first) sowing; `entries` every sowing made. */
export const createPlanResponseSchema = z.object({
  entry: planEntrySchema,
  entries: z.array(planEntrySchema),
});
export const emergenceResponseSchema = z.object({
  entry: planEntrySchema,
  emergence: emergenceRecordSchema,
});
