import { z } from 'zod';
import { idSchema, isoDateSchema } from './common';

/** Our own list of home test methods; a grower may type another. */
export const TEST_METHODS = ['tray of mix', 'paper towel', 'petri dish', 'soil block', 'rag doll'] as const;
export const pretreatmentSchema = z.enum(['none', 'soak', 'cold-stratification', 'scarification']);

export const createTestBodySchema = z
  .object({
    startDate: isoDateSchema,
    method: z.string().trim().min(1, { message: 'Say how the seeds are tested.' }).max(80),
    medium: z.string().trim().max(120).nullable().optional(),
    temperatureC: z.number().min(-5).max(45).nullable().optional(),
    lightHours: z.number().min(0).max(24).nullable().optional(),
    pretreatment: pretreatmentSchema.optional(),
    pretreatmentDays: z.number().int().min(0).max(365).nullable().optional(),
    notes: z.string().trim().max(4000).nullable().optional(),
    trays: z
      .array(z.object({ seedsSown: z.number().int().min(1, { message: 'Sow at least one seed.' }).max(10_000) }))
      .min(1, { message: 'A test has at least one tray.' })
      .max(8, { message: 'A test has at most 8 trays.' }),
  })
  .refine((b) => b.pretreatment !== 'cold-stratification' || b.pretreatmentDays != null, {
    path: ['pretreatmentDays'],
    message: 'Say how many days of cold stratification.',
    when: () => true,
  });
export type CreateTestBody = z.infer<typeof createTestBodySchema>;

export const updateTestBodySchema = z
  .object({
    method: z.string().trim().min(1).max(80),
    medium: z.string().trim().max(120).nullable(),
    temperatureC: z.number().min(-5).max(45).nullable(),
    lightHours: z.number().min(0).max(24).nullable(),
    pretreatment: pretreatmentSchema,
    pretreatmentDays: z.number().int().min(0).max(365).nullable(),
    notes: z.string().trim().max(4000).nullable(),
  })
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });

export const countsBodySchema = z.object({
  date: isoDateSchema,
  trays: z
    .array(z.object({ trayId: idSchema, cumulative: z.number().int().min(0, { message: 'A count cannot be negative.' }) }))
    .min(1, { message: 'Count at least one tray.' })
    .max(8),
});
export type CountsBody = z.infer<typeof countsBodySchema>;

export const finishBodySchema = z.object({
  date: isoDateSchema,
  trays: z
    .array(
      z.object({
        trayId: idSchema,
        abnormal: z.number().int().min(0),
        ungerminated: z.number().int().min(0),
        fresh: z.number().int().min(0).nullable().optional(),
        dead: z.number().int().min(0).nullable().optional(),
        hard: z.number().int().min(0).nullable().optional(),
      }),
    )
    .min(1)
    .max(8),
});
export type FinishBody = z.infer<typeof finishBodySchema>;

export const traySchema = z.object({
  id: idSchema,
  position: z.number(),
  seedsSown: z.number(),
  abnormal: z.number().nullable(),
  ungerminated: z.number().nullable(),
  fresh: z.number().nullable(),
  dead: z.number().nullable(),
  hard: z.number().nullable(),
});

export const testSchema = z.object({
  id: idSchema,
  lotId: idSchema,
  lotCode: z.string(),
  speciesName: z.string(),
  variety: z.string(),
  startDate: z.string(),
  method: z.string(),
  medium: z.string().nullable(),
  temperatureC: z.number().nullable(),
  lightHours: z.number().nullable(),
  pretreatment: pretreatmentSchema,
  pretreatmentDays: z.number().nullable(),
  notes: z.string().nullable(),
  status: z.enum(['running', 'finished']),
  finishedOn: z.string().nullable(),
  /** Seeds the test took from the lot's stock ledger (0 for a test imported as history). */
  seedsTaken: z.number(),
  /** Suggested check dates from the species' first and final count days. */
  schedule: z.object({ firstCountDate: z.string().nullable(), finalCountDate: z.string().nullable() }),
  createdAt: z.string(),
});
export type TestDto = z.infer<typeof testSchema>;

export const countSchema = z.object({ trayId: idSchema, date: z.string(), day: z.number(), cumulative: z.number() });

const nullableNumber = z.number().nullable();
export const resultSchema = z.object({
  sown: nullableNumber,
  germinated: nullableNumber,
  percent: nullableNumber,
  percentRounded: nullableNumber,
  interval: z.object({ low: z.number(), high: z.number(), method: z.enum(['wilson', 'clopper-pearson']), confidence: z.number() }).nullable(),
  trayPercents: z.array(z.object({ id: z.string(), seedsSown: z.number(), germinated: nullableNumber, percent: nullableNumber })),
  agreement: z.object({ maxRange: nullableNumber, observedRange: nullableNumber, ok: z.boolean().nullable() }),
  homogeneity: z.object({ statistic: z.number(), df: z.number(), pValue: z.number() }).nullable(),
  meanDays: nullableNumber,
  variance: nullableNumber,
  rate: nullableNumber,
  coefficientOfVelocity: nullableNumber,
  t50Days: nullableNumber,
  t50DaysCoolbear: nullableNumber,
  speedIndex: nullableNumber,
  uncertaintyBits: nullableNumber,
  synchrony: nullableNumber,
  traysCounted: z.number(),
  traysTotal: z.number(),
  /** The result in plain words, for the result panel. */
  summary: z.array(z.string()),
});
export type TestResult = z.infer<typeof resultSchema>;

export const testDetailSchema = z.object({
  test: testSchema,
  trays: z.array(traySchema),
  counts: z.array(countSchema),
  result: resultSchema,
});
export type TestDetail = z.infer<typeof testDetailSchema>;

/** POST …/tests/import?dryRun=true: what a germination tests CSV would add, one entry per test. */
export const testsImportPreviewSchema = z.object({
  preview: z.array(
    z.object({
      /** The file line of the test's first record. */
      line: z.number(),
      /** The file's `test` reference. */
      test: z.string(),
      lotCode: z.string(),
      species: z.string(),
      variety: z.string(),
      startDate: z.string(),
      trays: z.number(),
      seedsSown: z.number(),
      checkDays: z.number(),
      finishedOn: z.string().nullable(),
    }),
  ),
});
export type TestsImportPreview = z.infer<typeof testsImportPreviewSchema>['preview'];
