import { z } from 'zod';
import { idSchema, isoDateSchema } from './common';

/** Our own list of home test methods; a grower may type another. */
export const ASSAY_METHODS = ['tray of mix', 'paper towel', 'petri dish', 'soil block', 'rag doll'] as const;
export const pretreatmentSchema = z.enum(['none', 'soak', 'cold-stratification', 'scarification']);

/** Which 95% interval a result carries: Wilson score (the default) or exact Clopper–Pearson. */
export const intervalMethodSchema = z.enum(['wilson', 'clopper-pearson']);
/** `?interval=…` on a germination test's detail. */
export const assayDetailQuerySchema = z.object({ interval: intervalMethodSchema.default('wilson') });

/** A grower's rough guess of the seeds in a tray not counted (server/stats SOWN_GUESS_RANGES). */
export const sownGuessSchema = z.enum(['pinch', 'few-dozen', 'hundreds']);
export type SownGuess = z.infer<typeof sownGuessSchema>;
/** A rough score of the seedlings in a tray when counting is hopeless (server/stats ROUGH_SCORE_BANDS). */
export const roughScoreSchema = z.enum(['none', 'few', 'half', 'most']);
export type RoughScore = z.infer<typeof roughScoreSchema>;

/** The words of a rough score, as the screens and the result say it ("seedlings came up: a few"). */
export const ROUGH_SCORE_WORDS: Readonly<Record<RoughScore, string>> = {
  none: 'none',
  few: 'a few',
  half: 'about half',
  most: 'most',
};
/** The words of a rough guess of seeds sown. */
export const SOWN_GUESS_WORDS: Readonly<Record<SownGuess, string>> = {
  pinch: 'a pinch',
  'few-dozen': 'a few dozen',
  hundreds: 'hundreds',
};
/** Rough scores from fewest to most seedlings: a later check day cannot score fewer. */
export const ROUGH_SCORE_ORDER: readonly RoughScore[] = ['none', 'few', 'half', 'most'];

const seedsCountSchema = z
  .number()
  .int({ message: 'Give a whole number of seeds.' })
  .min(1, { message: 'Sow at least one seed.' })
  .max(10_000);

/** How a tray was sown: seeds counted, a weight of the lot's material, or a rough guess. */
export const traySownSchema = z
  .discriminatedUnion(
    'by',
    [
      z.object({ by: z.literal('count'), seeds: seedsCountSchema }).strict(),
      z
        .object({
          by: z.literal('weight'),
          grams: z
            .number()
            .gt(0, { message: 'Give the weight sown in grams, above 0.' })
            .max(1000, { message: 'At most 1000 g in one tray.' }),
        })
        .strict(),
      z.object({ by: z.literal('guess'), about: sownGuessSchema }).strict(),
    ],
    { error: () => "Say how the tray was sown: by 'count', 'weight' or 'guess'." },
  )
  .meta({
    description:
      "How a tray was sown. count: seeds counted (1–10,000). weight: grams of the lot's material (above 0), turned into an estimated number of seeds with the lot's own seed weight and cleanliness from weighed samples, else the species' typical seeds per gram (422 when neither exists: weigh a sample or count). guess: a rough guess when nothing was counted (pinch ≈ 5–50, few-dozen ≈ 24–72, hundreds ≈ 150–900 seeds, our convention). The estimate is made once, at creation.",
  });
export type TraySown = z.infer<typeof traySownSchema>;

/**
 * A tray on create: `{ sown }`, or `{ seedsSown }`, the short form of `{ sown: { by: 'count', seeds } }`.
 */
export const trayCreateSchema = z
  .object({ seedsSown: seedsCountSchema.optional(), sown: traySownSchema.optional() })
  .strict()
  .refine((t) => (t.seedsSown === undefined) !== (t.sown === undefined), {
    message: 'Give the tray either seedsSown or sown, not both.',
    path: ['sown'],
  })
  .meta({
    description:
      "A tray on create: `{ sown }`, or `{ seedsSown }` as the short form of `{ sown: { by: 'count', seeds } }`; exactly one of them.",
  });
export type TrayCreate = z.infer<typeof trayCreateSchema>;

/** How a tray on create was sown, the short form read as a count. */
export const traySownOf = (t: TrayCreate): TraySown =>
  t.sown ?? { by: 'count', seeds: t.seedsSown ?? Number.NaN };

export const createAssayBodySchema = z
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
      .array(trayCreateSchema)
      .min(1, { message: 'A test has at least one tray.' })
      .max(8, { message: 'A test has at most 8 trays.' }),
  })
  .refine((b) => b.pretreatment !== 'cold-stratification' || b.pretreatmentDays != null, {
    path: ['pretreatmentDays'],
    message: 'Say how many days of cold stratification.',
    when: () => true,
  });
export type CreateAssayBody = z.infer<typeof createAssayBodySchema>;

export const updateAssayBodySchema = z
  .object({
    method: z.string().trim().min(1).max(80),
    medium: z.string().trim().max(120).nullable(),
    temperatureC: z.number().min(-5).max(45).nullable(),
    lightHours: z.number().min(0).max(24).nullable(),
    pretreatment: pretreatmentSchema,
    pretreatmentDays: z.number().int().min(0).max(365).nullable(),
    notes: z.string().trim().max(4000).nullable(),
    runnerId: idSchema.meta({
      description:
        'The member who runs the test from now on (an owner or grower of the bank; 422 for anyone else): its check-day reminders go to them.',
    }),
  })
  .partial()
  .refine((b) => Object.keys(b).length > 0, { message: 'Nothing to change.' });

export const countsBodySchema = z.object({
  date: isoDateSchema,
  trays: z
    .array(
      z
        .object({
          trayId: idSchema,
          cumulative: z.number().int().min(0, { message: 'A count cannot be negative.' }).optional(),
          score: roughScoreSchema.optional(),
        })
        .refine((t) => (t.cumulative === undefined) !== (t.score === undefined), {
          message: 'Give each tray either a count (cumulative) or a rough score (score), not both.',
          path: ['cumulative'],
        })
        .meta({
          description:
            "One tray on the check day: `cumulative`, its normal seedlings so far, or `score`, a rough score when counting is hopeless (none, few ≈ 5–35%, half ≈ 35–65%, most ≈ 65–100% of the seeds sown; our convention) — exactly one (both: 400). A tray is counted on every check day or scored on every one (mixing: 422); a later score cannot be lower (422). A scored tray gives no percentage, only words, and still informs the lot's viability.",
        }),
    )
    .min(1, { message: 'Count at least one tray.' })
    .max(8),
});
export type CountsBody = z.infer<typeof countsBodySchema>;

/** Why a tray is left out of every figure: spilled, dried out, eaten by mice… */
export const setAsideReasonSchema = z
  .string()
  .trim()
  .min(1, { message: 'Say why the tray is set aside (spilled, dried out…).' })
  .max(200, { message: 'Keep the reason under 200 characters.' });

/**
 * Each tray at the finish: its abnormal and ungerminated seeds (the normal seedlings are its last
 * count), or a reason to set it aside, when it cannot be counted to the end. A tray sown by weight
 * or guess, or scored roughly, may leave both out: they cannot be known.
 */
export const finishTraySchema = z
  .object({
    trayId: idSchema,
    abnormal: z.number().int().min(0).optional(),
    ungerminated: z.number().int().min(0).optional(),
    fresh: z.number().int().min(0).nullable().optional(),
    dead: z.number().int().min(0).nullable().optional(),
    hard: z.number().int().min(0).nullable().optional(),
    setAsideReason: setAsideReasonSchema.optional(),
  })
  .refine(
    (t) => t.setAsideReason !== undefined || (t.abnormal !== undefined) === (t.ungerminated !== undefined),
    {
      path: ['ungerminated'],
      message:
        'Give the abnormal and ungerminated seeds of the tray (a tray whose seeds or seedlings were not counted may leave both out), or a reason to set it aside.',
    },
  );
export type FinishTray = z.infer<typeof finishTraySchema>;

export const finishBodySchema = z.object({
  date: isoDateSchema,
  trays: z.array(finishTraySchema).min(1).max(8),
});
export type FinishBody = z.infer<typeof finishBodySchema>;

/** How a tray was sown, as read back: with the estimate of its seeds when they were not counted. */
export const traySownReadSchema = z.object({
  by: z.enum(['count', 'weight', 'guess']),
  /** The counted seeds (by count). */
  seeds: z.number().nullable(),
  /** The weight sown (by weight). */
  grams: z.number().nullable(),
  /** The grower's rough guess (by guess). */
  about: sownGuessSchema.nullable(),
  /** The estimate made when the tray was created; null when counted. */
  estimate: z
    .object({
      /** Expected seeds sown. */
      mean: z.number(),
      /** SD of the true number sown around the mean. */
      sd: z.number(),
      /** Plausible range (95%) of the number sown. */
      low: z.number(),
      high: z.number(),
      /** Whose seeds per gram turned grams into seeds (by weight): the lot's own or the species'. */
      basis: z.enum(['lot', 'species']).nullable(),
      /** By weight without a purity figure: the material was taken as clean seed. */
      purityAssumed: z.boolean(),
    })
    .nullable(),
});
export type TraySownRead = z.infer<typeof traySownReadSchema>;

export const traySchema = z.object({
  id: idSchema,
  position: z.number(),
  /** The counted seeds; null when the tray was sown by weight or by a guess (see `sown`). */
  seedsSown: z.number().nullable(),
  sown: traySownReadSchema,
  abnormal: z.number().nullable(),
  ungerminated: z.number().nullable(),
  fresh: z.number().nullable(),
  dead: z.number().nullable(),
  hard: z.number().nullable(),
  /** Set when the grower set the tray aside; such a tray is left out of every figure. */
  setAsideReason: z.string().nullable(),
});

/**
 * POST …/tests/:testId/set-aside: set the whole test aside with a reason (mouldy towel, too cold),
 * or take it back (null). It stays in the lot's history and leaves the viability model.
 */
export const assaySetAsideBodySchema = z.object({ reason: setAsideReasonSchema.nullable() });

/** PATCH …/tests/:testId/trays/:trayId: set a tray aside with a reason, or take it back (null). */
export const trayUpdateBodySchema = z.object({ setAsideReason: setAsideReasonSchema.nullable() });

export const assaySchema = z.object({
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
  /** Set when the grower set the whole test aside: it leaves the viability model. */
  setAsideReason: z.string().nullable(),
  /** Seeds the test took from the lot's stock ledger (0 for a test imported as history). */
  seedsTaken: z.number(),
  /** The member running the test (the one who started it unless changed): its check-day reminders go to them. */
  runnerId: idSchema.nullable().meta({
    description:
      "The member running the test: the one who started it unless changed (PATCH `runnerId`). Its check-day reminders go to them alone, and are skipped when that day's counts are already saved. While the runner is no longer an owner or grower of the bank (or null: their account is gone), they go to the bank's owners.",
  }),
  /** The runner's display name; null with `runnerId`. */
  runnerName: z.string().nullable(),
  /** Suggested check dates from the species' first and final count days. */
  schedule: z.object({ firstCountDate: z.string().nullable(), finalCountDate: z.string().nullable() }),
  createdAt: z.string(),
});
export type AssayDto = z.infer<typeof assaySchema>;

export const countSchema = z.object({
  trayId: idSchema,
  date: z.string(),
  day: z.number(),
  cumulative: z.number(),
});

/** A tray scored roughly on a check day (instead of counted). */
export const scoreSchema = z.object({
  trayId: idSchema,
  date: z.string(),
  day: z.number(),
  score: roughScoreSchema,
});

const nullableNumber = z.number().nullable();
export const resultSchema = z.object({
  /** Seeds sown in the counted trays; the expected number when seedsSownEstimated. */
  sown: nullableNumber,
  /** The seeds sown in the counted trays were estimated (by weight or guess): the interval carries it. */
  seedsSownEstimated: z.boolean().meta({
    description:
      'The seeds sown in the counted trays were estimated (by weight or guess): `percent` is about that much and `interval` (method widened-score) carries the uncertainty of the number sown.',
  }),
  /** SD of the true number sown in the counted trays (0 when counted). */
  sownSd: nullableNumber,
  /** More seedlings than the estimated seeds sown make plausible: no percentage is given. */
  seedlingsExceedSown: z.boolean().meta({
    description:
      'More seedlings than the estimated seeds sown make plausible (above mean + 1.96 SD): percent and interval are null.',
  }),
  germinated: nullableNumber,
  /** Null while no tray is counted, when only rough scores were given, or when seedlingsExceedSown. */
  percent: nullableNumber,
  percentRounded: nullableNumber,
  interval: z
    .object({
      low: z.number(),
      high: z.number(),
      /** widened-score: Wilson's score interval widened by the uncertainty of the seeds sown. */
      method: z.enum(['wilson', 'clopper-pearson', 'widened-score']),
      confidence: z.number(),
    })
    .nullable(),
  trayPercents: z.array(
    z.object({
      id: z.string(),
      /** The counted seeds; null when they were estimated (see sownMean, sownSd). */
      seedsSown: nullableNumber,
      sownMean: z.number(),
      sownSd: z.number(),
      /** The latest rough score of a tray scored instead of counted. */
      score: roughScoreSchema.nullable(),
      /** counted: in the figures; not-counted: no count yet, left out; scored: scored roughly, in no percentage; set-aside: left out of every figure. */
      state: z.enum(['counted', 'not-counted', 'scored', 'set-aside']),
      setAsideReason: z.string().nullable(),
      germinated: nullableNumber,
      percent: nullableNumber,
      abnormal: nullableNumber,
      ungerminated: nullableNumber,
      fresh: nullableNumber,
      dead: nullableNumber,
      hard: nullableNumber,
    }),
  ),
  /** tolerance-table: trays of one size, range rule (maxRange); chi-square: trays of different sizes (pValue). */
  agreement: z.object({
    method: z.enum(['tolerance-table', 'chi-square']),
    maxRange: nullableNumber,
    observedRange: nullableNumber,
    ok: z.boolean().nullable(),
    pValue: nullableNumber,
  }),
  homogeneity: z.object({ statistic: z.number(), df: z.number(), pValue: z.number() }).nullable(),
  /** Pooled finish figures of the trays in the figures; null unless every one of them has it. */
  abnormal: nullableNumber,
  ungerminated: nullableNumber,
  fresh: nullableNumber,
  dead: nullableNumber,
  hard: nullableNumber,
  meanDays: nullableNumber,
  variance: nullableNumber,
  rate: nullableNumber,
  coefficientOfVelocity: nullableNumber,
  t50Days: nullableNumber,
  t50DaysCoolbear: nullableNumber,
  speedIndex: nullableNumber,
  uncertaintyBits: nullableNumber,
  synchrony: nullableNumber,
  /** Why timing figures are null, in a grower's words; null when they are all given. */
  timingNote: z.string().nullable(),
  traysCounted: z.number(),
  traysTotal: z.number(),
  traysSetAside: z.number(),
  /** The result in plain words, for the result panel. */
  summary: z.array(z.string()),
});
export type AssayResult = z.infer<typeof resultSchema>;

/** A test's result as stored on the test (server/modules/germination/assay-results.ts): without the words. */
export const storedResultSchema = resultSchema.omit({ summary: true });
export type StoredResult = z.infer<typeof storedResultSchema>;

export const assayDetailSchema = z.object({
  test: assaySchema,
  trays: z.array(traySchema),
  counts: z.array(countSchema),
  /** Rough scores of trays whose seedlings were not counted. */
  scores: z.array(scoreSchema),
  result: resultSchema,
});
export type AssayDetail = z.infer<typeof assayDetailSchema>;

/** POST …/tests/import?dryRun=true: what a germination tests CSV would add, one entry per test. */
export const assaysImportPreviewSchema = z.object({
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
export type AssaysImportPreview = z.infer<typeof assaysImportPreviewSchema>['preview'];
