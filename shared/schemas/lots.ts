import { z } from 'zod';
import { idSchema, isoDateSchema } from './common';

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
  });
export type CreateLotBody = z.infer<typeof createLotBodySchema>;

export const updateLotBodySchema = z
  .object({ ...lotFields, status: lotStatusSchema })
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
  seedsOnHand: z.number(),
  parentPlantIds: z.array(idSchema),
  thumbUrl: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
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
      seedsOnHand: z.number(),
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
  balance: z.number(),
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
};
export const createPlantBodySchema = z.object(plantFields);
export const updatePlantBodySchema = z
  .object(plantFields)
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });
