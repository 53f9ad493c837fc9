// Reference traits for the species that ship with Hilum. Every trait value names its source in
// SOURCES, and each source says whether its values were read in the publication, recalled from
// memory, taken from common garden practice or computed. A value nobody here knows is null, and its
// source entry says so; memory values must be confirmed before they are presented as published.
import { z } from 'zod';
import { hardinessSchema, type Hardiness } from './schemas/species';

// ---------------------------------------------------------------------------------------------
// Sources
// ---------------------------------------------------------------------------------------------

export const sourceBasisSchema = z.enum([
  'read', // read in the named publication (sometimes through a page quoting it)
  'memory', // recalled from the named publication, not checked against it
  'common-practice', // a fact of the trade with no single publication behind it
  'computed', // worked out from other values in this file by the stated formula
  'unknown', // no value: not sourced and not known reliably from memory
  'not-published', // no value because the named publication sets none (recalled from memory)
]);
export type SourceBasis = z.infer<typeof sourceBasisSchema>;

export const sourceSchema = z.object({
  title: z.string().min(1),
  publisher: z.string().min(1).nullable(),
  year: z.number().int().min(1900).max(2100).nullable(),
  basis: sourceBasisSchema,
  note: z.string().min(1),
});
export type Source = z.infer<typeof sourceSchema>;

export const SOURCES = {
  taxonomy: {
    title: 'Standard botanical names and APG IV family placement',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'Scientific names and families from memory; confirm against a botanical names database.',
  },
  isu2017: {
    title: 'Seed Germination Guide, Horticulture & Home Pest News',
    publisher: 'Iowa State University Extension and Outreach',
    year: 2017,
    basis: 'read',
    note: 'Indoor sowing table: needs light (L) or cover (C), germination temperature in °F, weeks from sowing to transplant.',
  },
  isu2023: {
    title: 'Germination requirements',
    publisher: 'Iowa State University Extension and Outreach',
    year: 2023,
    basis: 'read',
    note: 'Days to germinate at a stated temperature, with light or dark.',
  },
  knottEmergence: {
    title:
      "Days to seedling emergence at different soil temperatures (Harrington & Minges 1954), in Knott's Handbook for Vegetable Growers, 4th ed.",
    publisher: 'John Wiley & Sons',
    year: 1997,
    basis: 'read',
    note: 'Read through a secondary page quoting the table. Soil temperatures in °F; no germination shown as null.',
  },
  isuSeedLife: {
    title: "Yard & Garden: seed life under good storage (from Knott's Handbook for Vegetable Growers)",
    publisher: 'Iowa State University Extension',
    year: 1999,
    basis: 'read',
    note: 'Approximate years seed stays viable under favourable storage.',
  },
  cfr20131: {
    title: '7 CFR 201.31, Minimum germination standards for vegetable seeds in interstate commerce',
    publisher: 'United States Code of Federal Regulations (Federal Seed Act regulations)',
    year: null,
    basis: 'read',
    note: 'Read values: tomato 75, lettuce 80, pepper 55, onion 70, cucumber 80 (percent).',
  },
  cfr20131Memory: {
    title: '7 CFR 201.31, Minimum germination standards for vegetable seeds in interstate commerce',
    publisher: 'United States Code of Federal Regulations (Federal Seed Act regulations)',
    year: null,
    basis: 'memory',
    note: 'From memory; confirm against the current text of the section before relying on it.',
  },
  cfr20131NoStandard: {
    title: '7 CFR 201.31, Minimum germination standards for vegetable seeds in interstate commerce',
    publisher: 'United States Code of Federal Regulations (Federal Seed Act regulations)',
    year: null,
    basis: 'not-published',
    note: 'The section covers vegetable seed; it sets no minimum for flower seed (from memory). State flower-seed rules may.',
  },
  seedCompanyChart: {
    title: 'Seeds-per-ounce chart of a seed company, reproduced by a retailer',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Typical values, converted seeds per ounce ÷ 28.35 = seeds per gram. Publisher not recorded.',
  },
  columnist: {
    title: 'Seeds-per-gram ranges given by a horticulture columnist',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Publication not recorded; treat as typical ranges.',
  },
  wehnerHorton1989: {
    title: 'Wehner & Horton (1989), Cucurbit Genetics Cooperative Report 12:16–17',
    publisher: 'Cucurbit Genetics Cooperative',
    year: 1989,
    basis: 'read',
    note: 'Cucumber seeds per gram across cultivars.',
  },
  midpointOfReadRange: {
    title: 'Midpoint of the seeds-per-gram range in this record',
    publisher: null,
    year: null,
    basis: 'computed',
    note: 'typical = (low + high) / 2; the range itself is [read].',
  },
  midpointOfMemoryRange: {
    title: 'Midpoint of the seeds-per-gram range in this record',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'typical = (low + high) / 2 of a range recalled from memory, so it is a memory value too.',
  },
  snapdragonSeedsMemory: {
    title: 'Snapdragon seeds per gram, about 6,300–7,000',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory; the publication is not recorded.',
  },
  countDaysRecalled: {
    title:
      'AOSA Rules for Testing Seeds / ISTA International Rules for Seed Testing, germination methods table',
    publisher: 'Association of Official Seed Analysts / International Seed Testing Association',
    year: null,
    basis: 'memory',
    note: 'First and final count days as recalled in the project reference notes, from memory; confirm against the current rules.',
  },
  countDaysMemory: {
    title:
      'AOSA Rules for Testing Seeds / ISTA International Rules for Seed Testing, germination methods table',
    publisher: 'Association of Official Seed Analysts / International Seed Testing Association',
    year: null,
    basis: 'memory',
    note: 'First and final count days from memory; confirm against the current rules.',
  },
  knottSoilTempMemory: {
    title:
      "Soil temperature conditions for vegetable seed germination (optimum range), in Knott's Handbook for Vegetable Growers",
    publisher: 'John Wiley & Sons',
    year: 1997,
    basis: 'memory',
    note: 'Optimum soil temperature range in °F, from memory.',
  },
  knottSoilTempCabbageMemory: {
    title:
      "Soil temperature conditions for vegetable seed germination (optimum range), in Knott's Handbook for Vegetable Growers",
    publisher: 'John Wiley & Sons',
    year: 1997,
    basis: 'memory',
    note: 'The table gives cabbage; its range is used here for the same species (Brassica oleracea). From memory.',
  },
  knottSeedsPerOunceMemory: {
    title: "Approximate number of seeds per ounce, in Knott's Handbook for Vegetable Growers",
    publisher: 'John Wiley & Sons',
    year: 1997,
    basis: 'memory',
    note: 'Seeds per ounce from memory, converted ÷ 28.35 to seeds per gram.',
  },
  knottSeedLifeMemory: {
    title: "Seed life under favourable storage, in Knott's Handbook for Vegetable Growers",
    publisher: 'John Wiley & Sons',
    year: 1997,
    basis: 'memory',
    note: 'Years, from memory (the read values of the same table are cited as isuSeedLife).',
  },
  sowingDepthPractice: {
    title: 'Sowing depth and light for germination, common garden practice',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'As usually given on seed packets and extension sowing guides, from memory.',
  },
  startTimingPractice: {
    title: 'Indoor start or direct sowing, weeks before the last spring frost, common garden practice',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'From memory; garden guides differ by a week or two, and the bank can adjust.',
  },
  slowBeddingPractice: {
    title: 'Slow bedding flowers started about 8–12 weeks before the last frost, common garden practice',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'No single source; the window within 8–12 weeks is chosen per species from memory.',
  },
  pollinationPractice: {
    title: 'Pollination habit for seed-saving isolation, common practice',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'Self- or cross-pollinating as seed-saving guides usually describe it, from memory.',
  },
  toxicityPractice: {
    title: 'Poisonous seeds and plants, common knowledge from poison-information and extension sources',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'From memory. The product defers to a local poison centre, doctor or veterinarian.',
  },
  purdueHo203: {
    title:
      'Frost resistance of vegetables, HO-203 (after University of Illinois VC-14, Vegetable Planting Guide)',
    publisher: 'Purdue University Cooperative Extension Service',
    year: null,
    basis: 'read',
    note: 'Read through a secondary page quoting the table: very hardy 4–6 weeks before the average frost-free date, frost tolerant 2–3 weeks before, tender on or after it, warm loving 1–2 weeks after. Hilum calls them hardy, half-hardy, tender and very tender. Onion: seed and sets very hardy, plants frost tolerant (Hilum starts onion as plants).',
  },
  purdueHo203FlowersMemory: {
    title: 'Frost resistance of annual flowers, HO-203',
    publisher: 'Purdue University Cooperative Extension Service',
    year: null,
    basis: 'memory',
    note: 'The flower table was read through a secondary page whose column headings were cut off; that its four groups follow the vegetable table’s order (hardy, half-hardy, tender, very tender) is from memory. Confirm against the publication.',
  },
  hardinessMemory: {
    title: 'Cold hardiness of garden plants, common garden practice',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'Not in the table read; the group is recalled from garden guides, from memory. Confirm before relying on it.',
  },
  unknown: {
    title: 'No value',
    publisher: null,
    year: null,
    basis: 'unknown',
    note: 'Not in the project reference notes and not known reliably from memory; left empty on purpose.',
  },
} as const satisfies Record<string, Source>;

export type SourceKey = keyof typeof SOURCES;
const SOURCE_KEYS = Object.keys(SOURCES) as [SourceKey, ...SourceKey[]];
export const sourceKeySchema = z.enum(SOURCE_KEYS);

// ---------------------------------------------------------------------------------------------
// Units
// ---------------------------------------------------------------------------------------------

export const GRAMS_PER_OUNCE = 28.35; // the conversion the reference notes use

export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}

export function seedsPerOunceToPerGram(perOunce: number): number {
  return perOunce / GRAMS_PER_OUNCE;
}

// ---------------------------------------------------------------------------------------------
// Schema of one species record
// ---------------------------------------------------------------------------------------------

/** Trait names used as keys of `sources`; every record names a source for each of them. */
export const TRAIT_KEYS = [
  'scientificName',
  'family',
  'firstCountDay',
  'finalCountDay',
  'germTemp',
  'lightToGerminate',
  'indoorStart', // startMethod and indoorStartWeeksBeforeFrost together
  'weeksSowingToTransplant',
  'homeGermination',
  'emergenceDaysBySoilTemp',
  'seedsPerGramRange',
  'seedsPerGramTypical',
  'storageLifeYears',
  'minGerminationPercent',
  'outcrossing',
  'poisonous', // poisonous and caution together
  'hardiness',
] as const;
export const traitKeySchema = z.enum(TRAIT_KEYS);
export type TraitKey = z.infer<typeof traitKeySchema>;

const day = z.number().int().positive();
const weeks = z.number().int().min(0).max(26);

export const germTempSchema = z
  .object({
    minC: z.number(),
    maxC: z.number(),
    sourceUnit: z.enum(['F', 'C']),
    minF: z.number().nullable(), // as read, when the source gives °F
    maxF: z.number().nullable(),
  })
  .check((ctx) => {
    const t = ctx.value;
    if (t.minC > t.maxC) ctx.issues.push({ code: 'custom', message: 'minC must be ≤ maxC', input: t });
    if (t.sourceUnit === 'F') {
      if (t.minF === null || t.maxF === null) {
        ctx.issues.push({ code: 'custom', message: 'a °F source keeps its °F values', input: t });
      } else if (t.minC !== fahrenheitToCelsius(t.minF) || t.maxC !== fahrenheitToCelsius(t.maxF)) {
        ctx.issues.push({ code: 'custom', message: '°C must be (°F − 32) × 5/9 exactly', input: t });
      }
    } else if (t.minF !== null || t.maxF !== null) {
      ctx.issues.push({ code: 'custom', message: 'a °C source has no °F values', input: t });
    }
  });
export type GermTemp = z.infer<typeof germTempSchema>;

/** Weeks before the last spring frost: `from` is the earliest sowing (the larger number). */
export const startWindowSchema = z
  .object({ from: weeks, to: weeks })
  .refine((w) => w.from >= w.to, { message: 'from (earliest) must be ≥ to (weeks before frost)' });

export const speciesReferenceSchema = z
  .object({
    key: z.string().regex(/^[a-z]+(-[a-z]+)*$/),
    scientificName: z.string().min(1),
    commonName: z.string().min(1),
    family: z.string().regex(/^[A-Z][a-z]+aceae$/),
    firstCountDay: day.nullable(),
    finalCountDay: day.nullable(),
    germTemp: germTempSchema.nullable(),
    lightToGerminate: z.enum(['light', 'cover', 'light-cover', 'either']),
    startMethod: z.enum(['indoor', 'direct', 'either']),
    indoorStartWeeksBeforeFrost: startWindowSchema.nullable(),
    /** Weeks from sowing to transplant as the source prints it (a duration, not a date). */
    weeksSowingToTransplant: z
      .object({ min: weeks, max: weeks })
      .refine((w) => w.min <= w.max, { message: 'min must be ≤ max' })
      .nullable(),
    /** Days to germinate at home conditions, with the temperature the source names. */
    homeGermination: z
      .object({
        daysMin: day,
        daysMax: day,
        atF: z.number(),
        atC: z.number(),
        light: z.enum(['light', 'dark']),
      })
      .refine((g) => g.daysMin <= g.daysMax && g.atC === fahrenheitToCelsius(g.atF), {
        message: 'daysMin ≤ daysMax and atC = (atF − 32) × 5/9',
      })
      .nullable(),
    /** Days to emergence by soil temperature; days null = no emergence at that temperature. */
    emergenceDaysBySoilTemp: z
      .array(
        z
          .object({ soilF: z.number(), soilC: z.number(), days: day.nullable() })
          .refine((e) => e.soilC === fahrenheitToCelsius(e.soilF), { message: 'soilC = (soilF − 32) × 5/9' }),
      )
      .min(1)
      .nullable(),
    seedsPerGram: z.object({
      range: z
        .object({ low: z.number().positive(), high: z.number().positive() })
        .refine((r) => r.low <= r.high, { message: 'low must be ≤ high' })
        .nullable(),
      typical: z.number().positive().nullable(),
    }),
    storageLifeYears: z.number().int().positive().nullable(),
    minGerminationPercent: z.number().int().min(0).max(100).nullable(),
    outcrossing: z.enum(['self', 'cross', 'mixed']).nullable(),
    poisonous: z.boolean(),
    /** Shown beside the species; also used for non-poisonous hazards (look-alikes, bitter fruit). */
    caution: z.string().min(1).nullable(),
    notes: z.string().min(1).nullable(),
    /** Cold hardiness: when plants go out or seed is sown outside, relative to the last frost. */
    hardiness: hardinessSchema.nullable(),
    sources: z.record(traitKeySchema, sourceKeySchema),
  })
  .check((ctx) => {
    const s = ctx.value;
    const issue = (message: string) => ctx.issues.push({ code: 'custom', message, input: s });
    if (s.firstCountDay !== null && s.finalCountDay !== null && s.finalCountDay <= s.firstCountDay) {
      issue('finalCountDay must be > firstCountDay');
    }
    if ((s.startMethod === 'direct') !== (s.indoorStartWeeksBeforeFrost === null)) {
      issue('direct sowing has no indoor window; indoor or either sowing has one');
    }
    const { range, typical } = s.seedsPerGram;
    if (range !== null && typical !== null && (typical < range.low || typical > range.high)) {
      issue('typical seeds per gram must lie within the range');
    }
    if (s.poisonous && s.caution === null) issue('a poisonous species needs a caution');
  });
export type SpeciesReference = z.infer<typeof speciesReferenceSchema>;

/** The value a trait key stands for, so a caller can check it against its source. */
export function speciesTraitValue(s: SpeciesReference, trait: TraitKey): unknown {
  switch (trait) {
    case 'indoorStart':
      return s.startMethod;
    case 'seedsPerGramRange':
      return s.seedsPerGram.range;
    case 'seedsPerGramTypical':
      return s.seedsPerGram.typical;
    case 'poisonous':
      return s.poisonous;
    default:
      return s[trait];
  }
}

// ---------------------------------------------------------------------------------------------
// Builders (keep the table below short and the conversions exact)
// ---------------------------------------------------------------------------------------------

function tempF(minF: number, maxF: number): GermTemp {
  return { minC: fahrenheitToCelsius(minF), maxC: fahrenheitToCelsius(maxF), sourceUnit: 'F', minF, maxF };
}

const SOIL_F = [32, 41, 50, 59, 68, 77, 86, 95] as const;
function emergence(days: readonly (number | null)[]): SpeciesReference['emergenceDaysBySoilTemp'] {
  return SOIL_F.map((soilF, i) => ({ soilF, soilC: fahrenheitToCelsius(soilF), days: days[i] ?? null }));
}

function homeDays(daysMin: number, daysMax: number, atF: number, light: 'light' | 'dark') {
  return { daysMin, daysMax, atF, atC: fahrenheitToCelsius(atF), light };
}

const weeksBefore = (from: number, to: number) => ({ from, to });
const midpoint = (low: number, high: number) => (low + high) / 2;

const NO_SEEDS_PER_GRAM = { range: null, typical: null };
const KEEP_FROM_CHILDREN =
  ' Keep seed and plants away from children and pets; if any is swallowed, call a local poison centre or doctor.';
const HEMLOCK_LOOKALIKE =
  'Flowering plants look like poison hemlock and other toxic wild relatives; be certain of the plant you save seed from, and follow local extension advice.';

type Sources = Record<TraitKey, SourceKey>;
/** Start from "no value" everywhere; each record overrides the traits it has. */
const BASE: Sources = {
  scientificName: 'taxonomy',
  family: 'taxonomy',
  firstCountDay: 'unknown',
  finalCountDay: 'unknown',
  germTemp: 'unknown',
  lightToGerminate: 'sowingDepthPractice',
  indoorStart: 'startTimingPractice',
  weeksSowingToTransplant: 'unknown',
  homeGermination: 'unknown',
  emergenceDaysBySoilTemp: 'unknown',
  seedsPerGramRange: 'unknown',
  seedsPerGramTypical: 'unknown',
  storageLifeYears: 'unknown',
  minGerminationPercent: 'unknown',
  outcrossing: 'pollinationPractice',
  poisonous: 'toxicityPractice',
  hardiness: 'unknown',
};
const src = (overrides: Partial<Sources>): Sources => ({ ...BASE, ...overrides });

/** Defaults for the optional-looking columns, so each record lists only what it knows. */
const NONE = {
  firstCountDay: null,
  finalCountDay: null,
  germTemp: null,
  weeksSowingToTransplant: null,
  homeGermination: null,
  emergenceDaysBySoilTemp: null,
  seedsPerGram: NO_SEEDS_PER_GRAM,
  storageLifeYears: null,
  minGerminationPercent: null,
  outcrossing: null,
  poisonous: false,
  caution: null,
  notes: null,
} satisfies Partial<SpeciesReference>;

// Count-day sources: vegetables in 7 CFR / AOSA / ISTA from memory.
const countsMemory = { firstCountDay: 'countDaysMemory', finalCountDay: 'countDaysMemory' } as const;
const countsRecalled = { firstCountDay: 'countDaysRecalled', finalCountDay: 'countDaysRecalled' } as const;
const isuIndoor = {
  germTemp: 'isu2017',
  lightToGerminate: 'isu2017',
  weeksSowingToTransplant: 'isu2017',
} as const;
const flowerNoStandard = { minGerminationPercent: 'cfr20131NoStandard' } as const;

// ---------------------------------------------------------------------------------------------
// The reference set
// ---------------------------------------------------------------------------------------------

type RecordWithoutHardiness = Omit<SpeciesReference, 'hardiness'>;

const RECORDS: readonly RecordWithoutHardiness[] = [
  // ---- vegetables -----------------------------------------------------------------------------
  {
    ...NONE,
    key: 'tomato',
    scientificName: 'Solanum lycopersicum',
    commonName: 'Tomato',
    family: 'Solanaceae',
    firstCountDay: 5,
    finalCountDay: 14,
    germTemp: tempF(70, 75),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    weeksSowingToTransplant: { min: 5, max: 7 },
    emergenceDaysBySoilTemp: emergence([null, null, 43, 14, 8, 6, 6, 9]),
    seedsPerGram: { range: { low: 280, high: 420 }, typical: 390 },
    storageLifeYears: 4,
    minGerminationPercent: 75,
    outcrossing: 'self',
    poisonous: true,
    caution:
      'Leaves and stems contain glycoalkaloids and are harmful if eaten; the ripe fruit is food.' +
      KEEP_FROM_CHILDREN,
    sources: src({
      ...countsRecalled,
      ...isuIndoor,
      emergenceDaysBySoilTemp: 'knottEmergence',
      seedsPerGramRange: 'columnist',
      seedsPerGramTypical: 'seedCompanyChart',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131',
    }),
  },
  {
    ...NONE,
    key: 'pepper',
    scientificName: 'Capsicum annuum',
    commonName: 'Pepper',
    family: 'Solanaceae',
    firstCountDay: 7,
    finalCountDay: 14,
    germTemp: tempF(70, 75),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(10, 8),
    weeksSowingToTransplant: { min: 6, max: 8 },
    emergenceDaysBySoilTemp: emergence([null, null, null, 25, 13, 8, 8, 9]),
    seedsPerGram: { range: null, typical: 160 },
    storageLifeYears: 2,
    minGerminationPercent: 55,
    outcrossing: 'mixed',
    notes: 'Mostly self-pollinating, but insects cross peppers often enough that seed savers isolate them.',
    sources: src({
      ...countsRecalled,
      ...isuIndoor,
      emergenceDaysBySoilTemp: 'knottEmergence',
      seedsPerGramTypical: 'seedCompanyChart',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131',
    }),
  },
  {
    ...NONE,
    key: 'eggplant',
    scientificName: 'Solanum melongena',
    commonName: 'Eggplant',
    family: 'Solanaceae',
    firstCountDay: 7,
    finalCountDay: 14,
    germTemp: tempF(75, 90),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(10, 8),
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(6500) },
    storageLifeYears: 4,
    minGerminationPercent: 60,
    outcrossing: 'self',
    poisonous: true,
    caution:
      'Leaves, stems and flowers contain glycoalkaloids and are harmful if eaten.' + KEEP_FROM_CHILDREN,
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'lettuce',
    scientificName: 'Lactuca sativa',
    commonName: 'Lettuce',
    family: 'Asteraceae',
    firstCountDay: 4,
    finalCountDay: 7,
    germTemp: tempF(40, 80),
    lightToGerminate: 'light-cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(6, 4),
    emergenceDaysBySoilTemp: emergence([49, 15, 7, 4, 3, 2, 3, null]),
    seedsPerGram: { range: null, typical: 880 },
    storageLifeYears: 6,
    minGerminationPercent: 80,
    outcrossing: 'self',
    notes: 'Light helps many varieties germinate; warm soil (above about 80 °F) can hold seed dormant.',
    sources: src({
      ...countsRecalled,
      germTemp: 'knottSoilTempMemory',
      emergenceDaysBySoilTemp: 'knottEmergence',
      seedsPerGramTypical: 'seedCompanyChart',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131',
    }),
  },
  {
    ...NONE,
    key: 'onion',
    scientificName: 'Allium cepa',
    commonName: 'Onion',
    family: 'Amaryllidaceae',
    firstCountDay: 6,
    finalCountDay: 12,
    germTemp: tempF(70, 75),
    lightToGerminate: 'light-cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(12, 10),
    weeksSowingToTransplant: { min: 8, max: 10 },
    emergenceDaysBySoilTemp: emergence([136, 31, 13, 7, 5, 4, 4, 13]),
    seedsPerGram: { range: null, typical: 280 },
    storageLifeYears: 1,
    minGerminationPercent: 70,
    outcrossing: 'cross',
    poisonous: true,
    caution: 'All parts are toxic to dogs and cats if eaten.' + KEEP_FROM_CHILDREN,
    sources: src({
      ...countsRecalled,
      ...isuIndoor,
      emergenceDaysBySoilTemp: 'knottEmergence',
      seedsPerGramTypical: 'seedCompanyChart',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131',
    }),
  },
  {
    ...NONE,
    key: 'leek',
    scientificName: 'Allium porrum',
    commonName: 'Leek',
    family: 'Amaryllidaceae',
    firstCountDay: 6,
    finalCountDay: 14,
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(12, 10),
    storageLifeYears: 2,
    minGerminationPercent: 60,
    outcrossing: 'cross',
    poisonous: true,
    caution: 'All parts are toxic to dogs and cats if eaten.' + KEEP_FROM_CHILDREN,
    notes: 'Also named Allium ampeloprasum (Porrum group).',
    sources: src({
      ...countsMemory,
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'cabbage',
    scientificName: 'Brassica oleracea (Capitata group)',
    commonName: 'Cabbage',
    family: 'Brassicaceae',
    firstCountDay: 5,
    finalCountDay: 10,
    germTemp: tempF(45, 95),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(8500) },
    storageLifeYears: 4,
    minGerminationPercent: 75,
    outcrossing: 'cross',
    notes: 'Crosses with every other Brassica oleracea crop (broccoli, kale, cauliflower, kohlrabi).',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'broccoli',
    scientificName: 'Brassica oleracea (Italica group)',
    commonName: 'Broccoli',
    family: 'Brassicaceae',
    firstCountDay: 5,
    finalCountDay: 10,
    germTemp: tempF(45, 95),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(9000) },
    storageLifeYears: 3,
    minGerminationPercent: 75,
    outcrossing: 'cross',
    notes: 'Crosses with every other Brassica oleracea crop.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempCabbageMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'kale',
    scientificName: 'Brassica oleracea (Acephala group)',
    commonName: 'Kale',
    family: 'Brassicaceae',
    firstCountDay: 5,
    finalCountDay: 10,
    germTemp: tempF(45, 95),
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    storageLifeYears: 4,
    minGerminationPercent: 75,
    outcrossing: 'cross',
    notes:
      'Values are for Brassica oleracea kales; Siberian-type kales are Brassica napus and cross with that species instead.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempCabbageMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'carrot',
    scientificName: 'Daucus carota subsp. sativus',
    commonName: 'Carrot',
    family: 'Apiaceae',
    firstCountDay: 7,
    finalCountDay: 14,
    germTemp: tempF(45, 85),
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(22000) },
    storageLifeYears: 3,
    minGerminationPercent: 55,
    outcrossing: 'cross',
    caution: HEMLOCK_LOOKALIKE,
    notes: 'Crosses with wild carrot (Queen Anne’s lace) growing nearby.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'beet',
    scientificName: 'Beta vulgaris',
    commonName: 'Beet',
    family: 'Amaranthaceae',
    firstCountDay: 4,
    finalCountDay: 14,
    germTemp: tempF(50, 85),
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(1600) },
    storageLifeYears: 4,
    minGerminationPercent: 65,
    outcrossing: 'cross',
    notes: 'Each "seed" is a seed ball holding several seeds. Wind-pollinated; crosses with chard.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'spinach',
    scientificName: 'Spinacia oleracea',
    commonName: 'Spinach',
    family: 'Amaranthaceae',
    firstCountDay: 7,
    finalCountDay: 21,
    germTemp: tempF(45, 75),
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(2800) },
    storageLifeYears: 3,
    minGerminationPercent: 60,
    outcrossing: 'cross',
    notes: 'Wind-pollinated; male and female plants are separate.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'pea',
    scientificName: 'Pisum sativum',
    commonName: 'Pea',
    family: 'Fabaceae',
    firstCountDay: 5,
    finalCountDay: 8,
    germTemp: tempF(40, 75),
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    storageLifeYears: 3,
    minGerminationPercent: 80,
    outcrossing: 'self',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'bean',
    scientificName: 'Phaseolus vulgaris',
    commonName: 'Bean',
    family: 'Fabaceae',
    firstCountDay: 5,
    finalCountDay: 9,
    germTemp: tempF(60, 85),
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    storageLifeYears: 3,
    minGerminationPercent: 70,
    outcrossing: 'self',
    poisonous: true,
    caution:
      'Raw or undercooked dry beans contain a lectin (phytohaemagglutinin) that causes severe vomiting; seed kept for sowing is not food.' +
      KEEP_FROM_CHILDREN,
    notes: 'Minimum germination is the garden-bean standard.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'cucumber',
    scientificName: 'Cucumis sativus',
    commonName: 'Cucumber',
    family: 'Cucurbitaceae',
    firstCountDay: 4,
    finalCountDay: 8,
    germTemp: tempF(75, 80),
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(4, 2),
    weeksSowingToTransplant: { min: 3, max: 4 },
    emergenceDaysBySoilTemp: emergence([null, null, null, 13, 6, 4, 3, 3]),
    seedsPerGram: { range: { low: 32, high: 46 }, typical: midpoint(32, 46) },
    storageLifeYears: 5,
    minGerminationPercent: 80,
    outcrossing: 'cross',
    sources: src({
      ...countsRecalled,
      ...isuIndoor,
      emergenceDaysBySoilTemp: 'knottEmergence',
      seedsPerGramRange: 'wehnerHorton1989',
      seedsPerGramTypical: 'midpointOfReadRange',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131',
    }),
  },
  {
    ...NONE,
    key: 'squash',
    scientificName: 'Cucurbita pepo',
    commonName: 'Squash',
    family: 'Cucurbitaceae',
    firstCountDay: 4,
    finalCountDay: 8,
    germTemp: tempF(70, 95),
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(4, 2),
    storageLifeYears: 4,
    minGerminationPercent: 75,
    outcrossing: 'cross',
    caution:
      'Do not eat squash that tastes very bitter (cucurbitacins); saved seed crossed with ornamental gourds can grow bitter fruit.',
    notes: 'Crosses with every other Cucurbita pepo: zucchini, pumpkins, acorn squash and ornamental gourds.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      storageLifeYears: 'knottSeedLifeMemory',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  {
    ...NONE,
    key: 'sweet-corn',
    scientificName: 'Zea mays (sweet corn)',
    commonName: 'Sweet corn',
    family: 'Poaceae',
    firstCountDay: 4,
    finalCountDay: 7,
    germTemp: tempF(60, 95),
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    storageLifeYears: 2,
    minGerminationPercent: 75,
    outcrossing: 'cross',
    notes: 'Wind-pollinated; crosses with field and pop corn.',
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  // ---- herbs ----------------------------------------------------------------------------------
  {
    ...NONE,
    key: 'basil',
    scientificName: 'Ocimum basilicum',
    commonName: 'Basil',
    family: 'Lamiaceae',
    firstCountDay: 4,
    finalCountDay: 14,
    germTemp: tempF(65, 70),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(6, 4),
    weeksSowingToTransplant: { min: 5, max: 6 },
    outcrossing: 'cross',
    sources: src({ ...countsRecalled, ...isuIndoor }),
  },
  {
    ...NONE,
    key: 'parsley',
    scientificName: 'Petroselinum crispum',
    commonName: 'Parsley',
    family: 'Apiaceae',
    firstCountDay: 10,
    finalCountDay: 28,
    germTemp: tempF(50, 85),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(10, 8),
    seedsPerGram: { range: null, typical: seedsPerOunceToPerGram(18000) },
    storageLifeYears: 1,
    minGerminationPercent: 60,
    outcrossing: 'cross',
    caution: HEMLOCK_LOOKALIKE,
    sources: src({
      ...countsMemory,
      germTemp: 'knottSoilTempMemory',
      seedsPerGramTypical: 'knottSeedsPerOunceMemory',
      storageLifeYears: 'isuSeedLife',
      minGerminationPercent: 'cfr20131Memory',
    }),
  },
  // ---- bedding flowers ------------------------------------------------------------------------
  {
    ...NONE,
    key: 'petunia',
    scientificName: 'Petunia × atkinsiana',
    commonName: 'Petunia',
    family: 'Solanaceae',
    firstCountDay: 7,
    finalCountDay: 14,
    germTemp: tempF(75, 80),
    lightToGerminate: 'light',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(12, 10),
    weeksSowingToTransplant: { min: 8, max: 10 },
    homeGermination: homeDays(7, 10, 75, 'light'),
    seedsPerGram: { range: { low: 8800, high: 10600 }, typical: midpoint(8800, 10600) },
    minGerminationPercent: null,
    notes: 'Garden petunias, also named Petunia × hybrida. Pelleted seed counts differ.',
    sources: src({
      ...countsRecalled,
      ...isuIndoor,
      indoorStart: 'slowBeddingPractice',
      homeGermination: 'isu2023',
      seedsPerGramRange: 'columnist',
      seedsPerGramTypical: 'midpointOfReadRange',
      outcrossing: 'unknown',
      ...flowerNoStandard,
    }),
  },
  {
    ...NONE,
    key: 'snapdragon',
    scientificName: 'Antirrhinum majus',
    commonName: 'Snapdragon',
    family: 'Plantaginaceae',
    germTemp: tempF(70, 75),
    lightToGerminate: 'light',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(10, 8),
    weeksSowingToTransplant: { min: 8, max: 10 },
    homeGermination: homeDays(7, 14, 70, 'light'),
    seedsPerGram: { range: { low: 6300, high: 7000 }, typical: midpoint(6300, 7000) },
    sources: src({
      ...isuIndoor,
      indoorStart: 'slowBeddingPractice',
      homeGermination: 'isu2023',
      seedsPerGramRange: 'snapdragonSeedsMemory',
      seedsPerGramTypical: 'midpointOfMemoryRange',
      outcrossing: 'unknown',
      ...flowerNoStandard,
    }),
  },
  {
    ...NONE,
    key: 'marigold',
    scientificName: 'Tagetes erecta and T. patula',
    commonName: 'Marigold',
    family: 'Asteraceae',
    firstCountDay: 4,
    finalCountDay: 14,
    germTemp: tempF(70, 75),
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    weeksSowingToTransplant: { min: 6, max: 8 },
    seedsPerGram: { range: { low: 265, high: 350 }, typical: midpoint(265, 350) },
    outcrossing: 'cross',
    notes: 'African (T. erecta) and French (T. patula) marigolds; pot marigold is calendula.',
    sources: src({
      ...countsRecalled,
      ...isuIndoor,
      seedsPerGramRange: 'columnist',
      seedsPerGramTypical: 'midpointOfReadRange',
      ...flowerNoStandard,
    }),
  },
  {
    ...NONE,
    key: 'zinnia',
    scientificName: 'Zinnia elegans',
    commonName: 'Zinnia',
    family: 'Asteraceae',
    germTemp: tempF(70, 75),
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(6, 4),
    weeksSowingToTransplant: { min: 4, max: 6 },
    homeGermination: homeDays(5, 7, 70, 'dark'),
    seedsPerGram: { range: { low: 70, high: 210 }, typical: midpoint(70, 210) },
    outcrossing: 'cross',
    sources: src({
      ...isuIndoor,
      homeGermination: 'isu2023',
      seedsPerGramRange: 'columnist',
      seedsPerGramTypical: 'midpointOfReadRange',
      ...flowerNoStandard,
    }),
  },
  {
    ...NONE,
    key: 'cosmos',
    scientificName: 'Cosmos bipinnatus',
    commonName: 'Cosmos',
    family: 'Asteraceae',
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(6, 4),
    outcrossing: 'cross',
    sources: src({ ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'calendula',
    scientificName: 'Calendula officinalis',
    commonName: 'Calendula',
    family: 'Asteraceae',
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    outcrossing: 'cross',
    sources: src({ ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'sweet-pea',
    scientificName: 'Lathyrus odoratus',
    commonName: 'Sweet pea',
    family: 'Fabaceae',
    lightToGerminate: 'cover',
    startMethod: 'either',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    outcrossing: 'self',
    poisonous: true,
    caution:
      'Seeds are poisonous: eaten in quantity they cause lathyrism. Sweet peas are not edible peas; keep seed apart from food peas.' +
      KEEP_FROM_CHILDREN,
    sources: src({ ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'nasturtium',
    scientificName: 'Tropaeolum majus',
    commonName: 'Nasturtium',
    family: 'Tropaeolaceae',
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    outcrossing: 'cross',
    sources: src({ ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'viola',
    scientificName: 'Viola × wittrockiana',
    commonName: 'Viola (pansy)',
    family: 'Violaceae',
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(12, 10),
    outcrossing: 'cross',
    notes: 'Germinates best in darkness.',
    sources: src({ indoorStart: 'slowBeddingPractice', ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'aster',
    scientificName: 'Callistephus chinensis',
    commonName: 'China aster',
    family: 'Asteraceae',
    firstCountDay: 4,
    finalCountDay: 14,
    lightToGerminate: 'cover',
    startMethod: 'indoor',
    indoorStartWeeksBeforeFrost: weeksBefore(8, 6),
    sources: src({ ...countsMemory, outcrossing: 'unknown', ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'sunflower',
    scientificName: 'Helianthus annuus',
    commonName: 'Sunflower',
    family: 'Asteraceae',
    firstCountDay: 4,
    finalCountDay: 10,
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    outcrossing: 'cross',
    sources: src({ ...countsMemory, ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'poppy',
    scientificName: 'Papaver rhoeas',
    commonName: 'Corn poppy',
    family: 'Papaveraceae',
    lightToGerminate: 'light',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    outcrossing: 'cross',
    poisonous: true,
    caution:
      'All parts contain alkaloids and are harmful if eaten, especially by pets and livestock.' +
      KEEP_FROM_CHILDREN,
    notes:
      'Self-incompatible, so it needs insects and other plants to set seed. Some poppy species are restricted; follow local rules.',
    sources: src({ ...flowerNoStandard }),
  },
  {
    ...NONE,
    key: 'morning-glory',
    scientificName: 'Ipomoea tricolor',
    commonName: 'Morning glory',
    family: 'Convolvulaceae',
    lightToGerminate: 'cover',
    startMethod: 'direct',
    indoorStartWeeksBeforeFrost: null,
    poisonous: true,
    caution: 'Seeds are poisonous (they contain ergoline alkaloids).' + KEEP_FROM_CHILDREN,
    notes: 'Seed is usually nicked or soaked before sowing.',
    sources: src({ outcrossing: 'unknown', ...flowerNoStandard }),
  },
];

/** Each species' cold hardiness and the source it comes from (keys of the records above). */
const HARDINESS_OF: Record<string, [Hardiness, SourceKey]> = {
  tomato: ['tender', 'purdueHo203'],
  pepper: ['very-tender', 'purdueHo203'],
  eggplant: ['very-tender', 'purdueHo203'],
  lettuce: ['hardy', 'purdueHo203'],
  onion: ['half-hardy', 'purdueHo203'],
  leek: ['hardy', 'hardinessMemory'],
  cabbage: ['half-hardy', 'purdueHo203'],
  broccoli: ['half-hardy', 'purdueHo203'],
  kale: ['hardy', 'purdueHo203'],
  carrot: ['half-hardy', 'purdueHo203'],
  beet: ['half-hardy', 'purdueHo203'],
  spinach: ['hardy', 'purdueHo203'],
  pea: ['hardy', 'purdueHo203'],
  bean: ['tender', 'purdueHo203'],
  cucumber: ['very-tender', 'purdueHo203'],
  squash: ['very-tender', 'purdueHo203'],
  'sweet-corn': ['tender', 'purdueHo203'],
  basil: ['very-tender', 'hardinessMemory'],
  parsley: ['half-hardy', 'hardinessMemory'],
  petunia: ['tender', 'purdueHo203FlowersMemory'],
  snapdragon: ['hardy', 'purdueHo203FlowersMemory'],
  marigold: ['very-tender', 'purdueHo203FlowersMemory'],
  zinnia: ['very-tender', 'purdueHo203FlowersMemory'],
  cosmos: ['very-tender', 'purdueHo203FlowersMemory'],
  calendula: ['hardy', 'purdueHo203FlowersMemory'],
  'sweet-pea': ['hardy', 'purdueHo203FlowersMemory'],
  viola: ['hardy', 'purdueHo203FlowersMemory'],
  aster: ['tender', 'purdueHo203FlowersMemory'],
  nasturtium: ['tender', 'hardinessMemory'],
  sunflower: ['tender', 'hardinessMemory'],
  poppy: ['hardy', 'hardinessMemory'],
  'morning-glory': ['tender', 'hardinessMemory'],
};

export const SPECIES_REFERENCE: readonly SpeciesReference[] = RECORDS.map((r) => {
  const [hardiness, source] = HARDINESS_OF[r.key] ?? [null, 'unknown' as const];
  return { ...r, hardiness, sources: { ...r.sources, hardiness: source } };
});
