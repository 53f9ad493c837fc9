// Keeping a variety true: how parent plants were kept apart from other varieties, the warnings
// Hilum gives on them, and the grow-out list (the lots the decision calls `grow-out`).
import { z } from 'zod';
import { idSchema } from './common';
import { POLLINATION } from './species';

export const ISOLATION_METHODS = ['distance', 'time', 'bagging', 'none'] as const;

/**
 * How a parent plant was kept apart from other varieties of its species: by distance (metres to
 * the nearest other variety), by time (flowering staggered), by bagging or caging its flowers, or
 * not at all. Null (or left out) is "not said".
 */
export const isolationSchema = z.discriminatedUnion(
  'method',
  [
    z.object({
      method: z.literal('distance'),
      meters: z
        .number({ message: 'Give the distance in metres.' })
        .min(0, { message: 'A distance is 0 metres or more.' })
        .max(100_000, { message: 'At most 100,000 metres (100 km).' }),
    }),
    z.object({ method: z.literal('time') }),
    z.object({ method: z.literal('bagging') }),
    z.object({ method: z.literal('none') }),
  ],
  { message: 'Choose distance (with metres), time, bagging or none.' },
);
export type Isolation = z.infer<typeof isolationSchema>;
export type IsolationMethod = (typeof ISOLATION_METHODS)[number];

/** A warning on keeping a variety true, in plain words naming its numbers. */
export const seedSavingWarningSchema = z.object({
  kind: z.enum(['population', 'isolation']),
  message: z.string(),
});
export type SeedSavingWarning = z.infer<typeof seedSavingWarningSchema>;

/** GET …/lots/:lotId/keeping-true: the lot's population and isolation, and the warnings on them. */
export const keepingTrueResponseSchema = z.object({
  lotId: idSchema,
  speciesName: z.string(),
  pollination: z.enum(POLLINATION).nullable(),
  isolationMeters: z.number().nullable(),
  minPlantsForSeed: z.number().nullable(),
  /** Plants the lot's seed was saved from: plants bulked, else its parent plants; null when not said. */
  plantsSavedFrom: z.number().nullable(),
  parentPlants: z.number(),
  warnings: z.array(seedSavingWarningSchema),
});
export type KeepingTrueResponse = z.infer<typeof keepingTrueResponseSchema>;

/** One variety the decision calls `grow-out`, with the plants a sound seed crop needs. */
export const growOutItemSchema = z.object({
  lotId: idSchema,
  code: z.string(),
  speciesId: idSchema,
  species: z.string(),
  variety: z.string(),
  seedsOnHand: z.number().nullable(),
  /** The decision's reason, as the ranking gives it. */
  reason: z.string(),
  /** Plants to grow for seed (the species' minPlantsForSeed), null when not known. */
  plantsForSeed: z.number().nullable(),
  pollination: z.enum(POLLINATION).nullable(),
  isolationMeters: z.number().nullable(),
  biennial: z.boolean(),
  /** The season the seed is harvested in: next summer, or the summer after for a biennial. */
  seedSeason: z.number(),
});
export type GrowOutItem = z.infer<typeof growOutItemSchema>;
export const growOutResponseSchema = z.object({
  on: z.string(),
  /** The season the seed crop is sown in (the coming one). */
  season: z.number(),
  items: z.array(growOutItemSchema),
});
export type GrowOutResponse = z.infer<typeof growOutResponseSchema>;
