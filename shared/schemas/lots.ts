import { z } from 'zod';
import { idSchema, isoDateSchema } from './common';
import { isolationSchema, seedSavingWarningSchema } from './seed-saving';

export const originSchema = z.enum(['saved', 'swapped', 'bought'], {
  message: 'Choose saved, swapped or bought.',
});
export const lotStatusSchema = z.enum(['active', 'depleted', 'retired']);
export const storagePlaceSchema = z.enum(['room', 'fridge', 'freezer', 'other']);
export const movementKindSchema = z.enum(['initial', 'sown', 'given', 'swapped-in', 'test', 'correction']);
export type MovementKind = z.infer<typeof movementKindSchema>;

const text = (max: number) => z.string().trim().max(max);
const optionalText = (max: number) =>
  text(max)
    .transform((v) => (v === '' ? null : v))
    .nullable()
    .optional();

export const lotCodeSchema = z
  .string()
  .trim()
  .min(2, { message: 'A code has at least 2 characters.' })
  .max(24, { message: 'A code has at most 24 characters.' })
  .regex(/^[A-Za-z0-9][A-Za-z0-9-]*$/, { message: 'Use letters, digits and dashes.' });

/** How a lot's amount is known; 'unknown' is not zero. */
export const amountKindSchema = z.enum(['counted', 'estimated', 'weighed', 'unknown']);
export type AmountKind = z.infer<typeof amountKindSchema>;

const seedsOfLot = z
  .number({ message: 'Give a whole number of seeds.' })
  .int({ message: 'Give a whole number of seeds.' })
  .min(0, { message: 'A lot holds 0 seeds or more.' })
  .max(10_000_000, { message: 'A lot holds at most 10,000,000 seeds.' });
const gramsOfLot = z
  .number({ message: 'Give the weight in grams.' })
  .positive({ message: 'A weight is above 0 grams.' })
  .max(100_000, { message: 'A lot weighs at most 100,000 grams here.' });

/** A lot's amount as the grower gives it: counted, about N, weighed in grams, or not known. */
export const amountInputSchema = z
  .discriminatedUnion(
    'kind',
    [
      z.object({ kind: z.literal('counted'), seeds: seedsOfLot }).strict(),
      z
        .object({
          kind: z.literal('estimated'),
          seeds: seedsOfLot.min(1, { message: 'About how many seeds?' }),
        })
        .strict(),
      z.object({ kind: z.literal('weighed'), grams: gramsOfLot }).strict(),
      z.object({ kind: z.literal('unknown') }).strict(),
    ],
    { message: 'Choose counted, estimated, weighed or unknown.' },
  )
  .describe(
    'The lot’s amount: counted seeds, about N seeds (estimated), grams turned into seeds with the lot’s own seed weight (else its species’ typical seeds per gram), or not known — which is never zero.',
  );
export type AmountInput = z.infer<typeof amountInputSchema>;

const lotFields = {
  speciesId: idSchema,
  variety: text(120).min(1, { message: 'Name the variety (or “unknown”).' }),
  origin: originSchema,
  sourceName: optionalText(160),
  harvestDate: isoDateSchema.nullable().optional(),
  packedForSeason: z.number().int().min(1900).max(2100).nullable().optional(),
  parentPlantIds: z.array(idSchema).max(50).optional(),
  plantsBulked: z.number().int().min(1).max(100_000).nullable().optional(),
  storage: z
    .object({
      place: storagePlaceSchema.nullable().optional(),
      location: optionalText(160),
      temperatureC: z.number().min(-30).max(40).nullable().optional(),
      humidityPct: z.number().min(0).max(100).nullable().optional(),
    })
    .optional(),
  notes: optionalText(4000),
  code: lotCodeSchema.optional(),
  /** Sold coated with fungicide or another treatment. */
  treated: z.boolean().optional(),
};

export const createLotBodySchema = z
  .object({
    ...lotFields,
    /** The lot's amount; seedCount and grams are its short forms (counted, weighed). */
    amount: amountInputSchema.optional(),
    seedCount: z.number().int().min(0).max(10_000_000).optional(),
    grams: z.number().positive().max(100_000).optional(),
  })
  // `when: () => true` runs these even when other fields failed, so a form shows every problem at once.
  .refine((b) => Boolean(b.harvestDate || b.packedForSeason), {
    path: ['harvestDate'],
    message: 'Give the harvest date or the season it was packed for.',
    when: () => true,
  })
  .refine((b) => b.seedCount === undefined || b.grams === undefined, {
    path: ['grams'],
    message: 'Give a seed count or a weight, not both.',
    when: () => true,
  })
  .refine((b) => b.amount === undefined || (b.seedCount === undefined && b.grams === undefined), {
    path: ['amount'],
    message: 'Give the amount, or a seed count or a weight, not more than one.',
    when: () => true,
  });
export type CreateLotBody = z.infer<typeof createLotBodySchema>;

export const updateLotBodySchema = z
  .object({ ...lotFields, status: lotStatusSchema, amount: amountInputSchema })
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });
export type UpdateLotBody = z.infer<typeof updateLotBodySchema>;

/** `?size=full|thumb` on a photo file. */
export const photoSizeQuerySchema = z.object({ size: z.enum(['full', 'thumb']).default('full') });

export const photoSchema = z.object({
  id: idSchema,
  url: z.string(),
  thumbUrl: z.string(),
  width: z.number(),
  height: z.number(),
  createdAt: z.string(),
});
export type PhotoDto = z.infer<typeof photoSchema>;

/** A lot's amount as it is read: seeds for counted, estimated and weighed amounts, grams for weighed. */
export const lotAmountSchema = z
  .object({
    kind: amountKindSchema,
    seeds: z.number().optional(),
    grams: z.number().optional(),
    /** Weighed: whose seeds per gram turned the grams into seeds. */
    seedWeightBasis: z.enum(['lot', 'species']).optional(),
  })
  .describe(
    'How the amount is known. `seeds` (counted, estimated, weighed) is the ledger’s seeds on hand; `grams` the weight entered; `seedWeightBasis` whose seeds per gram turned it into seeds. `unknown` has no seeds: not known is not zero.',
  );
export type LotAmount = z.infer<typeof lotAmountSchema>;

const rangeSchema = z.object({ low: z.number(), high: z.number() });

/** Seeds per gram as grams → seeds uses it: the lot's own from weighed samples, else the species'. */
export const seedWeightSchema = z
  .object({
    seedsPerGram: z.number(),
    sampleSeeds: z.number().nullable(),
    sampleGrams: z.number().nullable(),
    purityFraction: z.number().nullable(),
    basis: z.enum(['lot', 'species']),
    thousandSeedWeight: z.number(),
    replicates: z.number(),
    replicateCv: z.number().nullable(),
    cvLimit: z.number().nullable(),
    cvCheck: z.enum(['within-limit', 'above-limit', 'single-sample']).nullable(),
    range: rangeSchema,
    purityRange: rangeSchema.nullable(),
  })
  .describe(
    'Seeds per gram as grams → seeds uses it. basis `lot`: from the lot’s weighed samples (sampleSeeds counted in sampleGrams of clean seed; replicates, the CV of a 100-seed replicate and the rules’ CV check; range is its 95% plausible range, taken at the rules’ CV limit with fewer than 8 samples); purityFraction is clean ÷ weighed from the samples that were cleaned. basis `species`: the species’ typical figure (range ±35% relative SD, a convention). Null when neither is known.',
  );
export type SeedWeightDto = z.infer<typeof seedWeightSchema>;

/** POST …/lots/:lotId/seed-weights: seeds counted, their weight, and their weight once cleaned. */
export const seedWeightBodySchema = z
  .object({
    seeds: z
      .number({ message: 'Count the seeds in the sample.' })
      .int({ message: 'Count whole seeds.' })
      .min(1, { message: 'Count at least one seed.' })
      .max(100_000, { message: 'A sample holds at most 100,000 seeds.' }),
    grams: z
      .number({ message: 'Give the sample’s weight in grams.' })
      .positive({ message: 'A weight is above 0 grams.' })
      .max(10_000, { message: 'A sample weighs at most 10,000 grams.' }),
    cleanGrams: z
      .number({ message: 'Give the clean seed’s weight in grams.' })
      .positive({ message: 'A weight is above 0 grams.' })
      .max(10_000, { message: 'A sample weighs at most 10,000 grams.' })
      .nullable()
      .optional(),
  })
  .strict()
  .refine((b) => b.cleanGrams == null || b.cleanGrams <= b.grams, {
    path: ['cleanGrams'],
    message: 'The clean seed cannot weigh more than the sample it was picked from.',
  });
export type SeedWeightBody = z.infer<typeof seedWeightBodySchema>;

// --- Generations: a lot's line back through the bank's earlier lots. ---

/** How many generations back a line is followed (a guard; real lines are far shorter). */
export const MAX_LINEAGE_DEPTH = 50;

export const lineageParentSchema = z.object({
  plantId: idSchema,
  label: z.string(),
  hybrid: z.boolean(),
  grownFromLotId: idSchema.nullable(),
  /** The code of the lot the plant grew from (null: not grown from a lot of this bank). */
  code: z.string().nullable(),
});
export type LineageParentDto = z.infer<typeof lineageParentSchema>;

export const lineageAncestorSchema = z.object({
  lotId: idSchema,
  code: z.string(),
  generation: z.number().int(),
  variety: z.string(),
  harvestDate: z.string().nullable(),
  packedForSeason: z.number().nullable(),
  /** Plants its seed was bulked from: its plantsBulked, else its parent plants counted; null: not known. */
  population: z.number().nullable(),
  /** Its parent plants included an F1 hybrid. */
  hybridParent: z.boolean(),
  /** The lots its parent plants grew from (the step before it in the line). */
  grownFromLotIds: z.array(idSchema),
});
export type LineageAncestorDto = z.infer<typeof lineageAncestorSchema>;

export const lineageSchema = z
  .object({
    generation: z.number().int().min(1),
    /** Plants this lot's seed was bulked from: plantsBulked, else its parent plants counted; null: not known. */
    population: z.number().nullable(),
    parents: z.array(lineageParentSchema),
    ancestors: z.array(lineageAncestorSchema),
    /** Seed-saving cautions the line calls for (a parent plant was an F1 hybrid). */
    cautions: z.array(z.string()),
  })
  .describe(
    `A lot's line. generation: 1 when none of its parent plants grew from a lot of this bank (bought or swapped seed, or seed saved from plants of unknown origin); a lot saved from plants grown from lot X is X's generation + 1 (from several lots: the latest generation + 1). parents: its parent plants with the lot each grew from (grownFromLotId, code). ancestors: the bank's earlier lots in its line, nearest first (highest generation first), each with its generation and population, followed at most ${MAX_LINEAGE_DEPTH} generations back. population: plants bulked (plantsBulked, else the parent plants counted). cautions: seed saved from an F1 hybrid does not come true.`,
  );
export type LineageDto = z.infer<typeof lineageSchema>;

export const lotSchema = z.object({
  id: idSchema,
  code: z.string(),
  speciesId: idSchema,
  speciesName: z.string(),
  scientificName: z.string(),
  variety: z.string(),
  origin: originSchema,
  sourceName: z.string().nullable(),
  harvestDate: z.string().nullable(),
  packedForSeason: z.number().nullable(),
  plantsBulked: z.number().nullable(),
  storage: z.object({
    place: storagePlaceSchema.nullable(),
    location: z.string().nullable(),
    temperatureC: z.number().nullable(),
    humidityPct: z.number().nullable(),
  }),
  quantityEstimated: z.boolean(),
  treated: z.boolean(),
  gramsEntered: z.number().nullable(),
  status: lotStatusSchema,
  notes: z.string().nullable(),
  /** The stock ledger's sum; null while the amount is not known (never read as zero). */
  seedsOnHand: z.number().nullable(),
  amount: lotAmountSchema,
  seedWeight: seedWeightSchema.nullable(),
  parentPlantIds: z.array(idSchema),
  thumbUrl: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  // Generations: on the read of one lot, not in lists.
  lineage: lineageSchema.optional(),
});
export type LotDto = z.infer<typeof lotSchema>;

export const lotsListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  cursor: z.string().max(200).optional(),
  q: z.string().trim().max(100).optional(),
  speciesId: idSchema.optional(),
  status: lotStatusSchema.optional(),
});

/** POST …/lots/import?dryRun=true: what a lots CSV would add, one entry per row. */
export const lotsImportPreviewSchema = z.object({
  preview: z.array(
    z.object({
      line: z.number(),
      code: z.string().nullable(),
      species: z.string(),
      variety: z.string(),
      /** Null: the amount is not known. */
      seedsOnHand: z.number().nullable(),
      harvestDate: z.string().nullable(),
      packedForSeason: z.number().nullable(),
      treated: z.boolean(),
    }),
  ),
});
export type LotsImportPreview = z.infer<typeof lotsImportPreviewSchema>['preview'];

export const movementSchema = z.object({
  id: idSchema,
  kind: movementKindSchema,
  change: z.number(),
  date: z.string(),
  reason: z.string(),
  by: z.string().nullable(),
  /** Seeds on hand after the movement; null while the lot's amount was not known. */
  balance: z.number().nullable(),
  createdAt: z.string(),
});
export type MovementDto = z.infer<typeof movementSchema>;

export const stockBodySchema = z
  .object({
    change: z
      .number()
      .int()
      .min(-10_000_000, { message: 'A movement changes the stock by at most 10,000,000 seeds.' })
      .max(10_000_000, { message: 'A movement changes the stock by at most 10,000,000 seeds.' })
      .refine((n) => n !== 0, { message: 'A movement changes the stock by at least one seed.' }),
    reason: text(300).min(1, { message: 'Say why (sown, given to …, found more, …).' }),
    date: isoDateSchema,
    kind: movementKindSchema.exclude(['initial', 'test']).optional(),
  })
  .superRefine((b, ctx) => {
    const kind = b.kind ?? 'correction';
    if ((kind === 'sown' || kind === 'given') && b.change > 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['change'],
        message: 'Sown or given seeds leave the lot: use a negative number.',
      });
    }
    if (kind === 'swapped-in' && b.change < 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['change'],
        message: 'Seeds swapped in add to the lot: use a positive number.',
      });
    }
  });
export type StockBody = z.infer<typeof stockBodySchema>;

export const parentPlantSchema = z.object({
  id: idSchema,
  speciesId: idSchema,
  speciesName: z.string(),
  label: z.string(),
  variety: z.string().nullable(),
  location: z.string().nullable(),
  season: z.number().nullable(),
  hybrid: z.boolean(),
  notes: z.string().nullable(),
  photos: z.array(photoSchema),
  /** Guidance for saving seed from this plant (hybrid, outcrossing), common practice. */
  cautions: z.array(z.string()),
  // Generations: the bank's lot this plant grew from.
  grownFromLotId: idSchema.nullable(),
  grownFromLotCode: z.string().nullable(),
  // Keeping a variety true (shared/schemas/seed-saving.ts).
  /** How the plant was kept apart from other varieties; null: not said. */
  isolation: isolationSchema.nullable(),
  /** Too few plants saved from, or a crossing variety nearby without isolation, in plain words. */
  warnings: z.array(seedSavingWarningSchema),
});
export type ParentPlantDto = z.infer<typeof parentPlantSchema>;

const plantFields = {
  speciesId: idSchema,
  label: text(120).min(1, { message: 'Label the plant or row, e.g. “Row 3, tallest”.' }),
  variety: optionalText(120),
  location: optionalText(160),
  season: z.number().int().min(1900).max(2100).nullable().optional(),
  hybrid: z.boolean().optional(),
  notes: optionalText(4000),
  // Generations: a lot of the same bank, or null.
  grownFromLotId: idSchema
    .nullable()
    .optional()
    .describe(
      'The lot of this bank the plant grew from (null: not grown from a lot of this bank). 422 when it is not a lot of this bank or of the plant’s species; 409 `lineage_cycle` when the plant is a parent of that lot or of a lot it descends from.',
    ),
  // Keeping a variety true: how the plant was kept apart (null clears it).
  isolation: isolationSchema.nullable().optional(),
};
export const createPlantBodySchema = z.object(plantFields);
export const updatePlantBodySchema = z
  .object(plantFields)
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });

// --- Generations: plants kept for seed from a sown plan entry. ---

/** POST /api/banks/:bankId/plants/from-sowing: these `plants` plants grew from the sowing's lot. */
export const plantsFromSowingBodySchema = z
  .object({
    entryId: idSchema,
    plants: z
      .number({ message: 'How many plants will you save seed from?' })
      .int({ message: 'A whole number of plants.' })
      .min(1, { message: 'At least one plant.' })
      .max(500, { message: 'At most 500 plants at a time.' }),
    label: text(100).min(1, { message: 'Label the plants, e.g. “Bed 2”.' }).optional(),
    location: optionalText(160),
    hybrid: z.boolean().optional(),
  })
  .strict();
export type PlantsFromSowingBody = z.infer<typeof plantsFromSowingBodySchema>;
