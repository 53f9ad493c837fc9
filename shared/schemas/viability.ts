import { z } from 'zod';
import { roughScoreSchema } from './germination';
import { idSchema, isoDateSchema } from './common';
import { originSchema } from './lots';
import { emergenceScoreSchema } from './plan';

const n = z.number();
const nn = z.number().nullable();

/** The advice for a lot (server/modules/viability/recommend.ts; rules in docs/decisions.md). */
export const recommendationSchema = z.enum([
  'test-first',
  'sow',
  'sow-thick',
  'retest',
  'grow-out',
  'retire',
]);
export type RecommendationValue = z.infer<typeof recommendationSchema>;
export const basisSchema = z.enum(['lot', 'species', 'typical']);

export const viabilityResponseSchema = z.object({
  lotId: idSchema,
  on: z.string(),
  ageYears: n,
  initialPercent: nn,
  sigmaYears: nn,
  halfLifeYears: nn,
  projected: z.object({ percent: n, low: n, high: n }).nullable(),
  retestBy: z.string().nullable(),
  retestReason: z.string().nullable(),
  basis: basisSchema.nullable(),
  /** No usable test of the lot: the projection is the species' typical figure, a guess. */
  estimateOnly: z.boolean(),
  /** The decision for the lot on `on`, the same as the ranking's. */
  recommendation: recommendationSchema,
  reason: z.string(),
  /** The germination the decision holds the lot to: the species' standard or the bank's threshold. */
  threshold: n,
  notes: z.array(z.string()),
  harvestReference: z.string(),
  /** Years until the projection falls to the threshold where the lot is kept now, in the fridge and in the freezer: estimates. */
  storageAdvice: z.array(
    z.object({
      place: z.enum(['room', 'fridge', 'freezer']),
      label: z.string(),
      current: z.boolean(),
      yearsToThreshold: nn,
    }),
  ),
  points: z.array(
    z.object({
      testId: idSchema,
      date: z.string(),
      ageYears: n,
      percent: n,
      germinated: n,
      /** Seeds sown; the expected number when seedsSownEstimated (sown by weight or guess). */
      sown: n,
      seedsSownEstimated: z.boolean(),
      /** The test's stored 95% interval (Wilson; widened when seeds sown were estimated). */
      low: nn,
      high: nn,
      heldBack: z.boolean(),
    }),
  ),
  /** Tests the grower set aside: out of the model, shown apart. */
  setAside: z.array(z.object({ testId: idSchema, date: z.string(), reason: z.string() })),
  /**
   * What came up from the lot's sowings (plan entries marked sown), oldest first: field emergence,
   * not a test. Each sowing's latest record is in the model, as weaker evidence than a test.
   */
  emergence: z.array(
    z.object({
      id: idSchema,
      entryId: idSchema,
      sownOn: z.string(),
      seedsSown: n,
      date: z.string(),
      seedlings: nn,
      score: emergenceScoreSchema.nullable(),
      ageYears: n,
      latest: z.boolean(),
    }),
  ),
  curve: z.array(z.object({ ageYears: n, percent: n, low: n, high: n })),
});
export type ViabilityResponse = z.infer<typeof viabilityResponseSchema>;

/** `?plants=&assurance=&on=` of seeds to sow; without `assurance`, the bank's own; without `on`, today. */
export const seedsToSowQuerySchema = z.object({
  plants: z.coerce.number().int().min(1, { message: 'At least one plant.' }).max(100_000),
  assurance: z.coerce
    .number()
    .gt(0.5, { message: 'Between 0.5 and 0.999.' })
    .max(0.999, { message: 'Between 0.5 and 0.999.' })
    .optional(),
  on: isoDateSchema.optional(),
});

export const seedsToSowResponseSchema = z.object({
  seeds: n,
  germinationUsed: n,
  assurance: n,
  plants: n,
  projectedPercent: n,
  projectedLow: n,
  projectedHigh: n,
  establishmentFactor: n,
  basis: basisSchema,
  /** Not tested: the figure is the species' typical one, a guess. */
  estimateOnly: z.boolean(),
  /** Null when the lot's amount is not known. */
  enoughStock: z.boolean().nullable(),
  seedsOnHand: nn,
  explanation: z.string(),
});
export type SeedsToSowResponse = z.infer<typeof seedsToSowResponseSchema>;

export const rankingItemSchema = z.object({
  lotId: idSchema,
  code: z.string(),
  speciesId: idSchema,
  species: z.string(),
  variety: z.string(),
  status: z.enum(['active', 'depleted', 'retired']),
  /** Where the seed came from, and from whom, as the lot records it. */
  origin: originSchema,
  sourceName: z.string().nullable(),
  /** Treated seed (a fungicide coat): lists mark it, so nobody handles it unawares. */
  treated: z.boolean(),
  ageYears: n,
  lastTestDate: z.string().nullable(),
  /** The latest test's stored percentage; null while uncounted, or when its trays were only scored roughly. */
  lastPercent: nn,
  /** lastPercent rests on seeds sown estimated by weight or guess (an "about" figure). */
  lastPercentEstimated: z.boolean(),
  /** When the latest test's trays were only scored roughly: the latest score (no percentage). */
  lastScore: roughScoreSchema.nullable(),
  projectedPercent: nn,
  projectedLow: nn,
  projectedHigh: nn,
  meanDays: nn,
  /** Null when the lot's amount is not known (never zero). */
  seedsOnHand: nn,
  basis: basisSchema.nullable(),
  estimateOnly: z.boolean(),
  retestBy: z.string().nullable(),
  thumbUrl: z.string().nullable(),
  recommendation: recommendationSchema,
  reason: z.string(),
});
export type RankingItem = z.infer<typeof rankingItemSchema>;
export const rankingResponseSchema = z.object({ on: z.string(), items: z.array(rankingItemSchema) });
