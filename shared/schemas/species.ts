import { z } from 'zod';
import { idSchema } from './common';

const day = z.number().int().min(1).max(120);
const weeks = z.number().int().min(0).max(26);

/** Cold hardiness: when the plants may go out (or be sown outside) relative to the last frost. */
export const HARDINESS = ['hardy', 'half-hardy', 'tender', 'very-tender'] as const;
export const hardinessSchema = z.enum(HARDINESS, {
  message: 'Choose hardy, half-hardy, tender or very tender.',
});
export type Hardiness = z.infer<typeof hardinessSchema>;

/** How a species is pollinated: insect, wind and mixed cross with other varieties of their kind. */
export const POLLINATION = ['self', 'insect', 'wind', 'mixed'] as const;
export type Pollination = (typeof POLLINATION)[number];

/** The traits Hilum uses in its computations; null where nobody knows the value. */
export const speciesTraitsSchema = z.object({
  firstCountDay: day.nullable(),
  finalCountDay: day.nullable(),
  germTempMinC: z.number().min(-5).max(45).nullable(),
  germTempMaxC: z.number().min(-5).max(45).nullable(),
  light: z.enum(['light', 'cover', 'light-cover', 'either']).nullable(),
  startMethod: z.enum(['indoor', 'direct', 'either']),
  /** Indoor sowing window in weeks before the last spring frost; from ≥ to. */
  startWeeksFrom: weeks.nullable(),
  startWeeksTo: weeks.nullable(),
  seedsPerGram: z.number().positive().max(100_000).nullable(),
  storageLifeYears: z.number().positive().max(100).nullable(),
  minGerminationPercent: z.number().min(0).max(100).nullable(),
  outcrossing: z.enum(['self', 'cross', 'mixed']).nullable(),
  poisonous: z.boolean(),
  caution: z.string().max(1000).nullable(),
  /** Room under the lights (shared/species-space.ts): weeks from sowing to potting up, 0 = sown in its pot. */
  potUpWeeks: weeks.nullable().optional(),
  /** Cells of bench a plant takes once potted up (a cell of a 72-cell tray is 1). */
  cellsPerPlant: z.number().int().min(1).max(72).nullable().optional(),
  hardiness: hardinessSchema.nullable(),
  /** Days from sowing to seedlings showing at sowing temperature (fewest, most). */
  emergeDaysMin: day.nullable(),
  emergeDaysMax: day.nullable(),
  // Keeping a variety true (shared/species-seed-saving.ts); optional so rows stored before read as unknown.
  /** How the species is pollinated; insect, wind and mixed cross with other varieties. */
  pollination: z.enum(POLLINATION, { message: 'Choose self, insect, wind or mixed.' }).nullable().optional(),
  /** Metres between two varieties for seed to come true. */
  isolationMeters: z.number().min(0).max(100_000).nullable().optional(),
  /** Fewest plants to save seed from without inbreeding depression. */
  minPlantsForSeed: z.number().int().min(1).max(10_000).nullable().optional(),
  /** Flowers and sets seed in its second season, after a winter. */
  biennial: z.boolean().optional(),
});
export type SpeciesTraits = z.infer<typeof speciesTraitsSchema>;
export type TraitName = keyof SpeciesTraits;

export const EMPTY_TRAITS: SpeciesTraits = {
  firstCountDay: null,
  finalCountDay: null,
  germTempMinC: null,
  germTempMaxC: null,
  light: null,
  startMethod: 'indoor',
  startWeeksFrom: null,
  startWeeksTo: null,
  seedsPerGram: null,
  storageLifeYears: null,
  minGerminationPercent: null,
  outcrossing: null,
  poisonous: false,
  caution: null,
  hardiness: null,
  emergeDaysMin: null,
  emergeDaysMax: null,
  pollination: null,
  isolationMeters: null,
  minPlantsForSeed: null,
  biennial: false,
};

function consistent(t: Partial<SpeciesTraits>, ctx: z.RefinementCtx) {
  if (t.firstCountDay != null && t.finalCountDay != null && t.firstCountDay > t.finalCountDay) {
    ctx.addIssue({
      code: 'custom',
      path: ['finalCountDay'],
      message: 'The final count day comes after the first.',
    });
  }
  if (t.germTempMinC != null && t.germTempMaxC != null && t.germTempMinC > t.germTempMaxC) {
    ctx.addIssue({
      code: 'custom',
      path: ['germTempMaxC'],
      message: 'The highest temperature must be at least the lowest.',
    });
  }
  if (t.emergeDaysMin != null && t.emergeDaysMax != null && t.emergeDaysMin > t.emergeDaysMax) {
    ctx.addIssue({
      code: 'custom',
      path: ['emergeDaysMax'],
      message: 'The most days to emerge must be at least the fewest.',
    });
  }
  if (t.startWeeksFrom != null && t.startWeeksTo != null && t.startWeeksFrom < t.startWeeksTo) {
    ctx.addIssue({
      code: 'custom',
      path: ['startWeeksTo'],
      message: 'Sowing starts earliest at the larger number of weeks before frost.',
    });
  }
}

export const sourceRefSchema = z.object({ title: z.string(), basis: z.string() });

export const speciesSchema = z.object({
  id: idSchema,
  commonName: z.string(),
  scientificName: z.string(),
  family: z.string().nullable(),
  reference: z.boolean(),
  traits: speciesTraitsSchema,
  /** Where each reference trait value comes from (title and whether read, from memory, …). */
  sources: z.record(z.string(), sourceRefSchema),
  /** Traits this bank has set for itself over the reference values. */
  overridden: z.array(z.string()),
});
export type SpeciesDto = z.infer<typeof speciesSchema>;
export const speciesListResponseSchema = z.object({ items: z.array(speciesSchema) });

export const createSpeciesBodySchema = z
  .object({
    commonName: z.string().trim().min(1, { message: 'Give the common name.' }).max(120),
    scientificName: z.string().trim().min(1, { message: 'Give the scientific name.' }).max(160),
    family: z.string().trim().max(80).nullable().optional(),
    traits: speciesTraitsSchema.partial().optional(),
  })
  .superRefine((b, ctx) => consistent(b.traits ?? {}, ctx));
export type CreateSpeciesBody = z.infer<typeof createSpeciesBodySchema>;

export const overrideTraitsBodySchema = z
  .object({ traits: speciesTraitsSchema.partial() })
  .superRefine((b, ctx) => consistent(b.traits, ctx));
