/**
 * CSV export and import of a bank's germination tests. Pure: no database, no I/O. The import
 * service wraps the write in one transaction; this module's part of "all or nothing" is that
 * `parseAssaysCsv` returns either every test or every problem it found.
 *
 * The file rules every Hilum CSV shares (RFC 4180 quoting, BOM, formula guard, trimmed cells,
 * header matching, line numbers) are in server/csv/csv-file.ts. What is particular to tests:
 * - One record per tray and check day, with the columns in `ASSAY_CSV_COLUMNS`: `cumulative` is the
 *   tray's cumulative normal seedlings on `check_date`. A tray with no counts yet has one record
 *   with `check_date` and `cumulative` empty. Required columns: test, lot_code, start_date, method,
 *   tray, seeds_sown; any other may be left out.
 * - `test` is a reference that groups the records of one test (the export writes the lot code and
 *   start date, plus "#2", "#3"… for a lot's further tests started the same day). On import any
 *   text will do; records with the same reference are one test, wherever they are in the file.
 * - A test's records agree on everything about the test (lot_code, start_date, method, medium,
 *   temperature_c, light_hours, pretreatment, pretreatment_days, notes, finished_on); a tray's
 *   records agree on its seeds_sown and finish values. Trays are numbered 1, 2, … without gaps.
 * - The lot is found by its code in the importing bank, in any letter case; species and variety are
 *   written for people reading the file and are not read back (the lot says what it is).
 * - A finished test has `finished_on` and, per tray, `abnormal` and `ungerminated` (and optionally
 *   the ungerminated split into `fresh`, `dead`, `hard`), repeated on each of the tray's records.
 * - `set_aside_reason`, repeated on a tray's records like the finish values, sets the tray aside
 *   (spilled, dried out): it is left out of every figure, so at a finish it has no finish values.
 *   A finished test's tray that was never counted must be set aside, and at least one tray must be
 *   left in the figures (the finish endpoint's rule).
 * - `germination_percent` is the test's stored result (assay-results.ts) rounded to the whole
 *   percent, the figure the test page, the ranking and the labels show. Like species and variety it
 *   is written for people and not read back: the import computes the result from the counts.
 * - A tray sown without counting has `seeds_sown` empty, `sown_by` weight or guess with
 *   `sown_grams` or `sown_guess`, and `seeds_sown_expected`, the estimate the result used; a tray
 *   scored roughly has its check day's `score` (none, few, half, most) and `cumulative` empty.
 *   `seeds_sown_estimated` says whether the test's `germination_percent` rests on estimated seeds
 *   sown; a test with only rough scores has no percentage. These columns are written for people:
 *   the import reads counted trays only.
 * - The checks are the API's own: the test body's schema, count-rules.ts for the counts of each
 *   check day, and the finish rule, so a file can hold nothing the screens could not have entered.
 *   No date may be after the bank's today.
 * - Imported tests are history: their seeds are not withdrawn from the lot's stock ledger, because
 *   the lot's seeds on hand already reflect them (the service says so too).
 */
import { dayInWords } from '#shared/day-words';
import { z } from 'zod';
import {
  createAssayBodySchema,
  pretreatmentSchema,
  setAsideReasonSchema,
  type RoughScore,
  type TraySownRead,
  type CreateAssayBody,
} from '#shared/schemas/germination';
import {
  blankToNull,
  choice,
  decimal,
  optionalDate,
  optionalText,
  requiredText,
  wholeNumber,
} from '#server/csv/csv-cells';
import {
  columnOf,
  numberCell,
  readCsv,
  textCell,
  unprotectCsvText,
  writeCsv,
  type CsvError,
  type CsvLayout,
} from '#server/csv/csv-file';
import { countProblems, finishProblem, startBeforeHarvest, uncountedAtFinish } from './count-rules';

/** What a test is: every record of a test repeats these. */
const SETUP_COLUMNS = [
  'start_date',
  'method',
  'medium',
  'temperature_c',
  'light_hours',
  'pretreatment',
  'pretreatment_days',
  'notes',
] as const;
/** A finished tray's seeds besides its normal seedlings; every record of a tray repeats these. */
const FINISH_COLUMNS = ['abnormal', 'ungerminated', 'fresh', 'dead', 'hard'] as const;
/** What every record of a tray repeats besides its seeds sown. */
const TRAY_COLUMNS = [...FINISH_COLUMNS, 'set_aside_reason'] as const;

export const ASSAY_CSV_COLUMNS = [
  'test',
  'lot_code',
  'species',
  'variety',
  ...SETUP_COLUMNS,
  'tray',
  'seeds_sown',
  'check_date',
  'cumulative',
  'finished_on',
  ...TRAY_COLUMNS,
  // Written for people, not read back (the import computes the result from the counts).
  'germination_percent',
  'seeds_sown_estimated',
  'sown_by',
  'sown_grams',
  'sown_guess',
  'seeds_sown_expected',
  'score',
] as const;
export type AssayCsvColumn = (typeof ASSAY_CSV_COLUMNS)[number];

const REQUIRED_COLUMNS: readonly AssayCsvColumn[] = [
  'test',
  'lot_code',
  'start_date',
  'method',
  'tray',
  'seeds_sown',
];
export const MAX_ASSAY_CSV_RECORDS = 20_000;

type Pretreatment = z.infer<typeof pretreatmentSchema>;

export interface AssayCsvTray {
  position: number;
  seedsSown: number;
  abnormal: number | null;
  ungerminated: number | null;
  fresh: number | null;
  dead: number | null;
  hard: number | null;
  /** Why the tray was set aside (spilled, dried out); such a tray is left out of every figure. */
  setAsideReason: string | null;
  /** Cumulative normal seedlings by check date, in date order. */
  counts: { date: string; cumulative: number }[];
}

/** A tray as the export writes it: how it was sown and its rough scores besides its counts. */
export interface AssayCsvExportTray extends Omit<AssayCsvTray, 'seedsSown'> {
  /** The counted seeds; null for a tray sown by weight or by a guess. */
  seedsSown: number | null;
  sown: TraySownRead;
  /** Rough scores by check date, for a tray scored instead of counted. */
  scores: { date: string; score: RoughScore }[];
}

interface AssayCsvFields {
  lotCode: string;
  startDate: string;
  method: string;
  medium: string | null;
  temperatureC: number | null;
  lightHours: number | null;
  pretreatment: Pretreatment;
  pretreatmentDays: number | null;
  notes: string | null;
  finishedOn: string | null;
  trays: AssayCsvTray[];
}

/** One test as the export writes it. */
export interface AssayCsvAssay extends Omit<AssayCsvFields, 'trays'> {
  speciesName: string;
  variety: string;
  /** The stored result's whole percent (`percentRounded`); null while no tray is in the figures. */
  germinationPercent: number | null;
  /** Whether that percent rests on seeds sown estimated by weight or guess. */
  seedsSownEstimated: boolean;
  trays: AssayCsvExportTray[];
}

/** One test as the import read it: its reference, its first line and the lot it belongs to. */
export interface ParsedAssayCsvAssay extends AssayCsvFields {
  ref: string;
  line: number;
  lotId: string;
}

export type AssayCsvParseResult =
  { ok: true; assays: ParsedAssayCsvAssay[] } | { ok: false; errors: CsvError[] };

const LAYOUT: CsvLayout<AssayCsvColumn> = {
  columns: ASSAY_CSV_COLUMNS,
  what: 'germination tests',
  missing: (seen) => REQUIRED_COLUMNS.filter((c) => !seen.has(c)).map((c) => `"${c}"`),
  maxRecords: MAX_ASSAY_CSV_RECORDS,
  tooMany: `The file holds more than ${MAX_ASSAY_CSV_RECORDS.toLocaleString('en')} records; import at most ${MAX_ASSAY_CSV_RECORDS.toLocaleString('en')} at a time (split the file between tests).`,
};

// ---------------------------------------------------------------------------------------------
// Export

/** Each test's reference: lot code and start date, "#2", "#3"… for a lot's later tests that day. */
export function assayReferences(assays: Pick<AssayCsvAssay, 'lotCode' | 'startDate'>[]): string[] {
  const seen = new Map<string, number>();
  return assays.map((t) => {
    const base = `${t.lotCode} ${t.startDate}`;
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    return n === 1 ? base : `${base} #${n}`;
  });
}

function trayRecords(
  ref: string,
  assay: AssayCsvAssay,
  tray: AssayCsvExportTray,
): Record<AssayCsvColumn, string>[] {
  const shared = {
    test: textCell(ref),
    lot_code: textCell(assay.lotCode),
    species: textCell(assay.speciesName),
    variety: textCell(assay.variety),
    start_date: assay.startDate,
    method: textCell(assay.method),
    medium: textCell(assay.medium),
    temperature_c: numberCell(assay.temperatureC),
    light_hours: numberCell(assay.lightHours),
    pretreatment: assay.pretreatment,
    pretreatment_days: numberCell(assay.pretreatmentDays),
    notes: textCell(assay.notes),
    tray: String(tray.position),
    seeds_sown: numberCell(tray.seedsSown),
    finished_on: assay.finishedOn ?? '',
    abnormal: numberCell(tray.abnormal),
    ungerminated: numberCell(tray.ungerminated),
    fresh: numberCell(tray.fresh),
    dead: numberCell(tray.dead),
    hard: numberCell(tray.hard),
    set_aside_reason: textCell(tray.setAsideReason),
    germination_percent: numberCell(assay.germinationPercent),
    seeds_sown_estimated: assay.germinationPercent === null ? '' : assay.seedsSownEstimated ? 'yes' : 'no',
    sown_by: tray.sown.by,
    sown_grams: numberCell(tray.sown.grams),
    sown_guess: tray.sown.about ?? '',
    seeds_sown_expected: numberCell(tray.sown.estimate ? Math.round(tray.sown.estimate.mean) : null),
  };
  const checks = [
    ...tray.counts.map((c) => ({ check_date: c.date, cumulative: String(c.cumulative), score: '' })),
    ...tray.scores.map((c) => ({ check_date: c.date, cumulative: '', score: c.score })),
  ].sort((a, b) => (a.check_date < b.check_date ? -1 : a.check_date > b.check_date ? 1 : 0));
  if (checks.length === 0) return [{ ...shared, check_date: '', cumulative: '', score: '' }];
  return checks.map((c) => ({ ...shared, ...c }));
}

/** The file: every test, tray by tray, one record per check day (tests in the order given). */
export function assaysToCsv(assays: AssayCsvAssay[]): string {
  const refs = assayReferences(assays);
  return writeCsv(
    ASSAY_CSV_COLUMNS,
    assays.flatMap((assay, i) => assay.trays.flatMap((tray) => trayRecords(refs[i]!, assay, tray))),
  );
}

// ---------------------------------------------------------------------------------------------
// One record's cells

const count = (what: string) =>
  z.preprocess(
    blankToNull,
    wholeNumber(0, 10_000, `Use a whole number of ${what} from 0 to 10,000, or leave it empty.`).nullable(),
  );

const recordSchema = z
  .object({
    test: requiredText(
      120,
      'The test reference',
      'Give the test this line belongs to (lines of one test share it).',
    ),
    lot_code: requiredText(40, 'The lot code', 'Give the code of the lot tested, as in this bank.'),
    start_date: z.iso.date({
      message: 'Use the day the test started, a date that exists written YYYY-MM-DD, like 2026-02-20.',
    }),
    method: requiredText(80, 'The method', 'Say how the seeds were tested, like paper towel.'),
    medium: optionalText(120, 'The medium'),
    temperature_c: z.preprocess(
      blankToNull,
      decimal(
        -5,
        45,
        'Use a temperature in °C from -5 to 45 (a point for decimals), or leave it empty.',
      ).nullable(),
    ),
    light_hours: z.preprocess(
      blankToNull,
      decimal(0, 24, 'Use hours of light a day from 0 to 24, or leave it empty.').nullable(),
    ),
    pretreatment: z.preprocess(
      (v) => (v === '' ? 'none' : v),
      choice(
        z.enum(pretreatmentSchema.enum, {
          message: 'Use none, soak, cold-stratification or scarification (empty means none).',
        }),
      ),
    ),
    pretreatment_days: z.preprocess(
      blankToNull,
      wholeNumber(0, 365, 'Use a whole number of days from 0 to 365, or leave it empty.').nullable(),
    ),
    notes: optionalText(4000, 'The notes'),
    tray: wholeNumber(1, 8, 'Use the tray number, 1 to 8.'),
    seeds_sown: wholeNumber(1, 10_000, 'Use a whole number of seeds sown in the tray, from 1 to 10,000.'),
    check_date: optionalDate(),
    cumulative: count('seedlings'),
    finished_on: optionalDate(),
    abnormal: count('abnormal seedlings'),
    ungerminated: count('ungerminated seeds'),
    fresh: count('fresh seeds'),
    dead: count('dead seeds'),
    hard: count('hard seeds'),
    // The API's own rule for a reason (trimmed, at most 200 characters); empty: the tray is in the figures.
    set_aside_reason: z
      .string()
      .transform(unprotectCsvText)
      .transform((v) => (v === '' ? null : v))
      .pipe(setAsideReasonSchema.nullable()),
  })
  .superRefine((c, ctx) => {
    if ((c.check_date === null) !== (c.cumulative === null)) {
      ctx.addIssue({
        code: 'custom',
        path: [c.check_date === null ? 'check_date' : 'cumulative'],
        message:
          'Give both the check date and the cumulative count, or leave both empty (a tray not yet counted).',
      });
    }
  });
type AssayCsvRecord = z.infer<typeof recordSchema> & { line: number; lotId: string };

/** The test-level columns every record of a test repeats. */
const ASSAY_COLUMNS = [...SETUP_COLUMNS, 'finished_on'] as const;

export interface AssayCsvContext {
  /** The id of this bank's lot with the code (any letter case); null when the bank has none. */
  resolveLot: (code: string) => string | null;
  /** Today on the bank's calendar (YYYY-MM-DD): no date in the file may be later. */
  today: string;
  /** The lot's harvest date, when it has one: no test of it may start earlier. */
  harvestDateOf?: (lotId: string) => string | null;
}

function recordErrors(context: AssayCsvContext, c: z.infer<typeof recordSchema>, line: number): CsvError[] {
  const errors: CsvError[] = [];
  const future = (column: 'start_date' | 'check_date' | 'finished_on', date: string | null) => {
    if (date !== null && date > context.today) {
      errors.push({
        line,
        column,
        message: `${date} is after today (${dayInWords(context.today)} in the bank's time zone).`,
      });
    }
  };
  future('start_date', c.start_date);
  future('check_date', c.check_date);
  future('finished_on', c.finished_on);
  if (c.check_date !== null && c.check_date < c.start_date) {
    errors.push({
      line,
      column: 'check_date',
      message: `A count cannot be dated before the test started (${dayInWords(c.start_date)}).`,
    });
  }
  return errors;
}

// ---------------------------------------------------------------------------------------------
// One test's records together

const same = (a: unknown, b: unknown) => a === b;

/** The columns of `columns` on which `record` differs from `first`. */
function disagreements<K extends keyof AssayCsvRecord>(
  first: AssayCsvRecord,
  record: AssayCsvRecord,
  columns: readonly K[],
  what: string,
): CsvError[] {
  return columns
    .filter((column) => !same(first[column], record[column]))
    .map((column) => ({
      line: record.line,
      column,
      message: `${what} gives ${column} as on line ${first.line} (${String(first[column] ?? 'empty')}), not ${String(record[column] ?? 'empty')}.`,
    }));
}

/** A tray's repeated value (finish values, set-aside reason): the non-empty ones must agree; returns the value or a disagreement. */
function trayValue<K extends (typeof TRAY_COLUMNS)[number]>(
  records: AssayCsvRecord[],
  column: K,
  errors: CsvError[],
): AssayCsvRecord[K] | null {
  const given = records.filter((r) => r[column] !== null);
  const first = given[0];
  for (const r of given.slice(1)) {
    if (r[column] !== first![column]) {
      errors.push({
        line: r.line,
        column,
        message: `Tray ${r.tray} gives ${column} ${String(first![column])} on line ${first!.line}; every line of a tray gives the same.`,
      });
    }
  }
  return first?.[column] ?? null;
}

const trayKey = (position: number) => `tray-${position}`;

/** Every problem of one test's records taken together, and the test when there is none. */
function checkAssay(
  ref: string,
  records: AssayCsvRecord[],
  context: AssayCsvContext,
): { errors: CsvError[]; assay: ParsedAssayCsvAssay | null } {
  const first = records[0]!;
  const what = `Test "${ref}"`;
  const errors: CsvError[] = [];
  for (const r of records.slice(1)) {
    if (r.lotId !== first.lotId) {
      errors.push({
        line: r.line,
        column: 'lot_code',
        message: `${what} is of lot ${first.lot_code} on line ${first.line}; one test tests one lot.`,
      });
    }
    errors.push(...disagreements(first, r, ASSAY_COLUMNS, what));
  }

  // Trays: numbered from 1 without gaps, one seeds_sown each, check days not repeated.
  const byTray = new Map<number, AssayCsvRecord[]>();
  for (const r of records) byTray.set(r.tray, [...(byTray.get(r.tray) ?? []), r]);
  const positions = [...byTray.keys()].sort((a, b) => a - b);
  const gap = positions.findIndex((p, i) => p !== i + 1);
  if (gap >= 0) {
    errors.push({
      line: first.line,
      column: 'tray',
      message: `${what} has trays ${positions.join(', ')}: number its trays 1, 2, … without gaps (tray ${gap + 1} is missing).`,
    });
  }
  const trays: AssayCsvTray[] = [];
  const countLines = new Map<string, number>();
  for (const position of positions) {
    const mine = byTray.get(position)!;
    for (const r of mine.slice(1)) {
      if (r.seeds_sown !== mine[0]!.seeds_sown) {
        errors.push({
          line: r.line,
          column: 'seeds_sown',
          message: `Tray ${position} of ${what.toLowerCase()} has ${mine[0]!.seeds_sown} seeds sown on line ${mine[0]!.line}; give one number for the tray.`,
        });
      }
    }
    const counts: AssayCsvTray['counts'] = [];
    for (const r of mine) {
      if (r.check_date === null || r.cumulative === null) continue;
      const key = `${position} ${r.check_date}`;
      const earlier = countLines.get(key);
      if (earlier !== undefined) {
        errors.push({
          line: r.line,
          column: 'check_date',
          message: `Tray ${position} is already counted on ${dayInWords(r.check_date)}, on line ${earlier}.`,
        });
        continue;
      }
      countLines.set(key, r.line);
      counts.push({ date: r.check_date, cumulative: r.cumulative });
    }
    counts.sort((a, b) => a.date.localeCompare(b.date));
    trays.push({
      position,
      seedsSown: mine[0]!.seeds_sown,
      abnormal: trayValue(mine, 'abnormal', errors),
      ungerminated: trayValue(mine, 'ungerminated', errors),
      fresh: trayValue(mine, 'fresh', errors),
      dead: trayValue(mine, 'dead', errors),
      hard: trayValue(mine, 'hard', errors),
      setAsideReason: trayValue(mine, 'set_aside_reason', errors),
      counts,
    });
  }

  const body = {
    startDate: first.start_date,
    method: first.method,
    medium: first.medium,
    temperatureC: first.temperature_c,
    lightHours: first.light_hours,
    pretreatment: first.pretreatment,
    pretreatmentDays: first.pretreatment_days,
    notes: first.notes,
    trays: trays.map((t) => ({ seedsSown: t.seedsSown })),
  } satisfies CreateAssayBody;
  errors.push(...bodyErrors(body, first.line));
  const early = startBeforeHarvest(
    first.start_date,
    context.harvestDateOf?.(first.lotId) ?? null,
    first.lot_code,
  );
  if (early) errors.push({ line: first.line, column: 'start_date', message: early });
  errors.push(...countErrors(first.start_date, trays, countLines));
  errors.push(...finishErrors(what, first, trays, byTray));

  if (errors.length > 0) return { errors, assay: null };
  return {
    errors,
    assay: {
      ref,
      line: first.line,
      lotId: first.lotId,
      lotCode: first.lot_code,
      startDate: body.startDate,
      method: body.method,
      medium: body.medium,
      temperatureC: body.temperatureC,
      lightHours: body.lightHours,
      pretreatment: body.pretreatment,
      pretreatmentDays: body.pretreatmentDays,
      notes: body.notes,
      finishedOn: first.finished_on,
      trays,
    },
  };
}

const BODY_COLUMNS: Record<string, AssayCsvColumn> = {
  startDate: 'start_date',
  method: 'method',
  medium: 'medium',
  temperatureC: 'temperature_c',
  lightHours: 'light_hours',
  pretreatment: 'pretreatment',
  pretreatmentDays: 'pretreatment_days',
  notes: 'notes',
  trays: 'tray',
};

/** What the API's own create schema (createAssayBodySchema) says of the test (e.g. cold stratification needs days). */
function bodyErrors(body: CreateAssayBody, line: number): CsvError[] {
  const parsed = createAssayBodySchema.safeParse(body);
  if (parsed.success) return [];
  return parsed.error.issues.map((issue) => {
    const key = columnOf(issue.path);
    const column = key === undefined ? undefined : BODY_COLUMNS[key];
    return column === undefined ? { line, message: issue.message } : { line, column, message: issue.message };
  });
}

/** count-rules.ts on each check day, against the same test's earlier days (a fall is reported once, on the later day). */
function countErrors(startDate: string, trays: AssayCsvTray[], countLines: Map<string, number>): CsvError[] {
  const rows = trays.map((t) => ({ id: trayKey(t.position), position: t.position, seeds_sown: t.seedsSown }));
  const all = trays
    .flatMap((t) =>
      t.counts.map((c) => ({
        tray_id: trayKey(t.position),
        position: t.position,
        check_date: c.date,
        cumulative: c.cumulative,
      })),
    )
    .sort((a, b) => a.check_date.localeCompare(b.check_date));
  const dates = [...new Set(all.map((c) => c.check_date))];
  return dates.flatMap((date) => {
    const today = all.filter((c) => c.check_date === date);
    const earlier = all.filter((c) => c.check_date < date);
    const body = { date, trays: today.map((c) => ({ trayId: c.tray_id, cumulative: c.cumulative })) };
    return countProblems(body, startDate, rows, earlier).map((p) => {
      const index = Number(p.field.split('.')[1]);
      const entry = today[index]!;
      return { line: countLines.get(`${entry.position} ${date}`)!, column: 'cumulative', message: p.message };
    });
  });
}

/**
 * The finish endpoint's rules, when the test is finished: every tray in the figures was counted and
 * adds up to its seeds sown, a tray set aside has no finish values, and at least one tray is in the figures.
 */
function finishErrors(
  what: string,
  first: AssayCsvRecord,
  trays: AssayCsvTray[],
  byTray: Map<number, AssayCsvRecord[]>,
): CsvError[] {
  const finishedOn = first.finished_on;
  const errors: CsvError[] = [];
  const lastLine = (position: number) => byTray.get(position)!.at(-1)!.line;
  if (finishedOn === null) {
    for (const tray of trays) {
      const given = FINISH_COLUMNS.find((c) => tray[c] !== null);
      if (given) {
        errors.push({
          line: lastLine(tray.position),
          column: 'finished_on',
          message: `Tray ${tray.position} gives ${given} seeds, which are counted when a test is finished: give finished_on too, or leave ${given} empty.`,
        });
      }
    }
    return errors;
  }
  const lastCount = trays
    .flatMap((t) => t.counts.map((c) => c.date))
    .sort()
    .at(-1);
  const notBefore = lastCount ?? first.start_date;
  if (finishedOn < notBefore) {
    errors.push({
      line: first.line,
      column: 'finished_on',
      message: `${what} cannot finish before its last count (${dayInWords(notBefore)}).`,
    });
  }
  for (const tray of trays) {
    if (tray.setAsideReason !== null) {
      // The finish endpoint keeps no figures for a tray set aside; a file that gives some means
      // either the reason or the figures are a slip, and only the grower knows which.
      const given = FINISH_COLUMNS.filter((c) => tray[c] !== null);
      if (given.length > 0) {
        errors.push({
          line: lastLine(tray.position),
          column: given[0]!,
          message: `Tray ${tray.position} is set aside (${tray.setAsideReason}), so it is left out of the figures and takes no finish values: leave ${given.join(', ')} empty, or empty set_aside_reason to keep the tray in the result.`,
        });
      }
      continue;
    }
    if (tray.counts.length === 0) {
      errors.push({
        line: lastLine(tray.position),
        column: 'set_aside_reason',
        message: uncountedAtFinish(tray.position),
      });
      continue;
    }
    if (tray.abnormal === null || tray.ungerminated === null) {
      errors.push({
        line: lastLine(tray.position),
        column: tray.abnormal === null ? 'abnormal' : 'ungerminated',
        message: `${what} is finished: give the abnormal and ungerminated seeds of tray ${tray.position}, or a set_aside_reason to leave it out.`,
      });
      continue;
    }
    const normal = tray.counts.at(-1)!.cumulative;
    const problem = finishProblem({ position: tray.position, seeds_sown: tray.seedsSown }, normal, {
      ...tray,
      abnormal: tray.abnormal,
      ungerminated: tray.ungerminated,
    });
    if (problem)
      errors.push({ line: lastLine(tray.position), column: problem.field, message: problem.message });
  }
  if (trays.length > 0 && trays.every((t) => t.setAsideReason !== null)) {
    errors.push({
      line: first.line,
      column: 'set_aside_reason',
      message: `${what} is finished but every tray is set aside, so it has no result: keep at least one counted tray, or leave the test out of the file.`,
    });
  }
  return errors;
}

// ---------------------------------------------------------------------------------------------
// The file

/**
 * Reads a germination tests CSV for one bank. Returns every test (grouped by the `test` column,
 * in the order of their first line) or every problem, each with its line and column.
 */
export function parseAssaysCsv(text: string, context: AssayCsvContext): AssayCsvParseResult {
  const groups = new Map<string, AssayCsvRecord[]>();
  const broken = new Set<string>();
  const read = readCsv(text, LAYOUT, (cells, line) => {
    const ref = unprotectCsvText(cells.test);
    const errors: CsvError[] = [];
    const parsed = recordSchema.safeParse(cells);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const column = columnOf(issue.path);
        errors.push(
          column === undefined ? { line, message: issue.message } : { line, column, message: issue.message },
        );
      }
    }
    // Checked even when other cells failed, so the user sees every problem of the line at once.
    const code = unprotectCsvText(cells.lot_code);
    const lotId = code === '' ? null : context.resolveLot(code);
    if (code !== '' && lotId === null) {
      errors.push({
        line,
        column: 'lot_code',
        message: `This bank has no lot with the code "${code}"; add the lot first (or import it from a lots CSV).`,
      });
    }
    if (parsed.success) errors.push(...recordErrors(context, parsed.data, line));
    if (errors.length > 0 || !parsed.success || lotId === null) {
      broken.add(ref);
      return errors;
    }
    groups.set(ref, [...(groups.get(ref) ?? []), { ...parsed.data, line, lotId }]);
    return [];
  });
  if (!read.ok) {
    // A test with a broken line is judged as a whole once the line is corrected: checking the
    // rest of it now would report trays or counts that only look missing.
    const together = [...groups]
      .filter(([ref]) => !broken.has(ref))
      .flatMap(([ref, records]) => checkAssay(ref, records, context).errors);
    return { ok: false, errors: [...read.errors, ...together].sort((a, b) => a.line - b.line) };
  }
  const assays: ParsedAssayCsvAssay[] = [];
  const errors: CsvError[] = [];
  for (const [ref, records] of groups) {
    const outcome = checkAssay(ref, records, context);
    errors.push(...outcome.errors);
    if (outcome.assay) assays.push(outcome.assay);
  }
  if (errors.length > 0) return { ok: false, errors: errors.sort((a, b) => a.line - b.line) };
  return { ok: true, assays };
}
