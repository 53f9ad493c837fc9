/**
 * CSV export and import of a bank's seed lots. Pure: no database, no I/O. The import route wraps
 * the write in one transaction; this module's part of "all or nothing" is that `parseLotsCsv`
 * returns either every row or every error it found (all rows checked, not just up to the first).
 *
 * The format, as the help page and the route should describe it:
 * - One header row with the names in `LOT_CSV_COLUMNS`, then one record per lot. Commas between
 *   cells; a cell holding a comma, a double quote or a line break is put in double quotes, with
 *   quotes inside doubled; records end with CRLF (RFC 4180 §2, rules 1, 6 and 7).
 * - Export starts with a UTF-8 byte order mark so spreadsheet programs read accented text as
 *   UTF-8 (common practice); import ignores one if present.
 * - Formula guard (OWASP "CSV Injection"): a spreadsheet runs a cell that starts with = + - @, tab
 *   or carriage return as a formula. On export such a *text* cell gets a leading apostrophe, which
 *   spreadsheets read as "this is text". On import one leading apostrophe is removed again from a
 *   text cell whose content after its leading apostrophes starts with one of those characters.
 *   Export adds the apostrophe to exactly those cells too (so "'=x" is written "''=x"), which makes
 *   the round trip lossless for every text value. Number cells are written by us from numbers, so a
 *   "-18" there is a sign, not a formula, and is not guarded.
 * - Import trims every cell. RFC 4180 §2 rule 4 counts spaces as part of a field; we deviate on
 *   purpose because stray spaces in hand-edited sheets are mistakes far more often than data. So
 *   leading and trailing spaces (and line breaks) of a text value do not survive a round trip.
 * - Header names may come in any order and any letter case; spaces and hyphens in them count as
 *   underscores ("Seeds on hand" = seeds_on_hand). A column we do not know is an error that names
 *   it (ignoring it would silently drop whatever the user typed there); a column whose header cell
 *   is blank is allowed only while all its cells are blank (spreadsheets sometimes add one).
 *   Required columns: species, variety, origin, seeds_on_hand, and harvest_date or
 *   packed_for_season. Any other column may be left out; its cells then read as empty (so a file
 *   from before a column existed, such as `treated`, still imports: its lots are not treated).
 * - `line` is the 1-based line of the file on which a record starts, header = line 1, counting
 *   every line break including those inside quoted cells (what a text editor shows). A
 *   spreadsheet's row number is the same unless an earlier cell holds a line break.
 * - Lot codes repeat case-insensitively (the database's unique index is on lower(code)), so
 *   "tom-1" and "TOM-1" in one file is a duplicate, reported on the later line.
 * - A file with only the header row parses to zero rows (ok), so an export of an empty bank
 *   re-imports cleanly; the route reports "0 lots imported".
 * - Cell values: yes/no (quantity_estimated, treated) also as true/false/1/0, in any letter case
 *   (empty = no); origin, storage_place and status in any letter case; numbers with a point as
 *   decimal separator.
 */
import Papa from 'papaparse';
import type { ParseError } from 'papaparse';
import { z } from 'zod';
import {
  lotCodeSchema,
  lotStatusSchema,
  originSchema,
  storagePlaceSchema,
} from '../../../shared/schemas/lots';

export const LOT_CSV_COLUMNS = [
  'code',
  'species',
  'scientific_name',
  'variety',
  'origin',
  'source_name',
  'harvest_date',
  'packed_for_season',
  'seeds_on_hand',
  'quantity_estimated',
  'plants_bulked',
  'storage_place',
  'storage_location',
  'storage_temp_c',
  'storage_humidity_pct',
  'status',
  'treated',
  'notes',
] as const;
export type LotCsvColumn = (typeof LOT_CSV_COLUMNS)[number];

/** Columns a file must have; besides these, one of DATE_COLUMNS. */
const REQUIRED_COLUMNS: readonly LotCsvColumn[] = ['species', 'variety', 'origin', 'seeds_on_hand'];
const DATE_COLUMNS: readonly LotCsvColumn[] = ['harvest_date', 'packed_for_season'];

export const MAX_LOT_CSV_ROWS = 5000;

export interface LotCsvRow {
  code: string | null;
  speciesName: string;
  scientificName: string | null;
  variety: string;
  origin: 'saved' | 'swapped' | 'bought';
  sourceName: string | null;
  harvestDate: string | null;
  packedForSeason: number | null;
  seedsOnHand: number;
  quantityEstimated: boolean;
  plantsBulked: number | null;
  storagePlace: 'room' | 'fridge' | 'freezer' | 'other' | null;
  storageLocation: string | null;
  storageTempC: number | null;
  storageHumidityPct: number | null;
  status: 'active' | 'depleted' | 'retired';
  /** Seed coated with fungicide or another treatment. */
  treated: boolean;
  notes: string | null;
}

export type ParsedLotCsvRow = LotCsvRow & { speciesId: string; line: number };
export interface LotCsvError {
  line: number;
  column?: string;
  message: string;
}
export type LotCsvParseResult = { ok: true; rows: ParsedLotCsvRow[] } | { ok: false; errors: LotCsvError[] };
/** Finds the bank's species for a row's names; null when there is none. */
export type ResolveSpecies = (name: { speciesName: string; scientificName: string | null }) => string | null;

// ---------------------------------------------------------------------------------------------
// Formula guard

/** Leading apostrophes, then a character that makes a spreadsheet read the cell as a formula. */
const FORMULA_LIKE = /^'*[=+\-@\t\r]/;

/** Text cell → what is written to the file (see the formula guard above). */
export function protectCsvText(value: string): string {
  return FORMULA_LIKE.test(value) ? `'${value}` : value;
}

/** The inverse of `protectCsvText`: removes exactly the apostrophe it adds. */
export function unprotectCsvText(value: string): string {
  return value.startsWith("'") && FORMULA_LIKE.test(value) ? value.slice(1) : value;
}

// ---------------------------------------------------------------------------------------------
// Export

const BOM = '\uFEFF';

function textCell(value: string | null): string {
  return value === null ? '' : protectCsvText(value);
}

function numberCell(value: number | null): string {
  return value === null ? '' : String(value);
}

function yesNoCell(value: boolean): string {
  return value ? 'yes' : 'no';
}

function toCells(row: LotCsvRow): Record<LotCsvColumn, string> {
  return {
    code: textCell(row.code),
    species: textCell(row.speciesName),
    scientific_name: textCell(row.scientificName),
    variety: textCell(row.variety),
    origin: row.origin,
    source_name: textCell(row.sourceName),
    harvest_date: row.harvestDate ?? '',
    packed_for_season: numberCell(row.packedForSeason),
    seeds_on_hand: numberCell(row.seedsOnHand),
    quantity_estimated: yesNoCell(row.quantityEstimated),
    plants_bulked: numberCell(row.plantsBulked),
    storage_place: row.storagePlace ?? '',
    storage_location: textCell(row.storageLocation),
    storage_temp_c: numberCell(row.storageTempC),
    storage_humidity_pct: numberCell(row.storageHumidityPct),
    status: row.status,
    treated: yesNoCell(row.treated),
    notes: textCell(row.notes),
  };
}

export function lotsToCsv(rows: LotCsvRow[]): string {
  const data = rows.map((row) => {
    const cells = toCells(row);
    return LOT_CSV_COLUMNS.map((column) => cells[column]);
  });
  return BOM + Papa.unparse({ fields: [...LOT_CSV_COLUMNS], data }, { newline: '\r\n' });
}

// ---------------------------------------------------------------------------------------------
// One row's cells → a lot (zod)

const blankToNull = (v: unknown) => (v === '' ? null : v);

function text(max: number, what: string) {
  return z
    .string()
    .transform(unprotectCsvText)
    .pipe(z.string().max(max, { message: `${what} has at most ${max} characters.` }));
}

function requiredText(max: number, what: string, missing: string) {
  return text(max, what).refine((v) => v !== '', { message: missing });
}

function optionalText(max: number, what: string) {
  return text(max, what).transform((v) => (v === '' ? null : v));
}

function wholeNumber(min: number, max: number, message: string) {
  return z
    .string()
    .regex(/^\d+$/, { message })
    .transform(Number)
    .pipe(z.number().int().min(min, { message }).max(max, { message }));
}

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function decimal(min: number, max: number, message: string) {
  return z
    .string()
    .regex(DECIMAL, { message })
    .transform(Number)
    .pipe(z.number().min(min, { message }).max(max, { message }));
}

/** A value from a fixed list, in any letter case. */
function choice<T extends z.ZodType<unknown, string>>(values: T) {
  return z
    .string()
    .transform((v) => v.toLowerCase())
    .pipe(values);
}

const YES = new Set(['yes', 'true', '1']);

/** yes/no, also as true/false/1/0 in any letter case; an empty cell (or a missing column) is no. */
function yesNo(message: string) {
  return choice(z.enum(['yes', 'no', 'true', 'false', '1', '0', ''], { message })).transform((v) => YES.has(v));
}

const rowSchema = z
  .object({
    code: z.preprocess(blankToNull, lotCodeSchema.nullable()),
    species: requiredText(
      120,
      'The species name',
      'Name the species (its common name, as in the species list).',
    ),
    scientific_name: optionalText(160, 'The scientific name'),
    variety: requiredText(120, 'The variety', 'Name the variety (or “unknown”).'),
    origin: choice(z.enum(originSchema.enum, { message: 'Use saved, swapped or bought.' })),
    source_name: optionalText(160, 'The source name'),
    harvest_date: z.preprocess(
      blankToNull,
      z.iso.date({ message: 'Use a date that exists, written YYYY-MM-DD, like 2026-05-24.' }).nullable(),
    ),
    packed_for_season: z.preprocess(
      blankToNull,
      wholeNumber(1900, 2100, 'Use a year from 1900 to 2100, like 2026.').nullable(),
    ),
    seeds_on_hand: wholeNumber(0, 10_000_000, 'Use a whole number of seeds from 0 to 10,000,000, like 250.'),
    quantity_estimated: yesNo('Use yes or no.'),
    plants_bulked: z.preprocess(
      blankToNull,
      wholeNumber(
        1,
        100_000,
        'Use a whole number of plants from 1 to 100,000, or leave it empty.',
      ).nullable(),
    ),
    storage_place: z.preprocess(
      blankToNull,
      choice(
        z.enum(storagePlaceSchema.enum, {
          message: 'Use room, fridge, freezer or other, or leave it empty.',
        }),
      ).nullable(),
    ),
    storage_location: optionalText(160, 'The storage location'),
    storage_temp_c: z.preprocess(
      blankToNull,
      decimal(
        -30,
        40,
        'Use a temperature in °C from -30 to 40 (a point for decimals), or leave it empty.',
      ).nullable(),
    ),
    storage_humidity_pct: z.preprocess(
      blankToNull,
      decimal(0, 100, 'Use a relative humidity in % from 0 to 100, or leave it empty.').nullable(),
    ),
    status: z.preprocess(
      (v) => (v === '' ? 'active' : v),
      choice(
        z.enum(lotStatusSchema.enum, { message: 'Use active, depleted or retired (empty means active).' }),
      ),
    ),
    treated: yesNo(
      'Use yes (the seed is coated with fungicide or another treatment) or no; empty means no.',
    ),
    notes: optionalText(4000, 'The notes'),
  })
  .superRefine((cells, ctx) => {
    if (cells.harvest_date === null && cells.packed_for_season === null) {
      ctx.addIssue({
        code: 'custom',
        path: ['harvest_date'],
        message: 'Give the harvest date or the season it was packed for (packed_for_season).',
      });
    }
  })
  .transform((c): LotCsvRow => ({
    code: c.code,
    speciesName: c.species,
    scientificName: c.scientific_name,
    variety: c.variety,
    origin: c.origin,
    sourceName: c.source_name,
    harvestDate: c.harvest_date,
    packedForSeason: c.packed_for_season,
    seedsOnHand: c.seeds_on_hand,
    quantityEstimated: c.quantity_estimated,
    plantsBulked: c.plants_bulked,
    storagePlace: c.storage_place,
    storageLocation: c.storage_location,
    storageTempC: c.storage_temp_c,
    storageHumidityPct: c.storage_humidity_pct,
    status: c.status,
    treated: c.treated,
    notes: c.notes,
  }));

// ---------------------------------------------------------------------------------------------
// Lines

const LINE_BREAK = /\r\n|\r|\n/g;

function countLineBreaks(s: string): number {
  return s.match(LINE_BREAK)?.length ?? 0;
}

/** 1-based line number of a character offset; offsets must be asked for in increasing order. */
function lineCounter(text: string): (offset: number) => number {
  let pos = 0;
  let breaks = 0;
  return (offset) => {
    const chunk = text.slice(pos, offset);
    breaks += countLineBreaks(chunk);
    // A CRLF split across two chunks was counted twice.
    if (pos > 0 && chunk.startsWith('\n') && text[pos - 1] === '\r') breaks -= 1;
    pos = Math.max(pos, offset);
    return breaks + 1;
  };
}

// ---------------------------------------------------------------------------------------------
// Header

const KNOWN = new Set<string>(LOT_CSV_COLUMNS);

function normalizeHeader(name: string): string {
  return name
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');
}

function listNames(names: readonly string[]): string {
  return names.map((n) => `"${n}"`).join(', ');
}

function checkHeader(headers: readonly string[], firstLine: string): LotCsvError[] {
  const known = headers.filter((h) => KNOWN.has(h));
  if (known.length === 0) {
    const separator = firstLine.includes(';') ? 'semicolons' : firstLine.includes('\t') ? 'tabs' : null;
    const message =
      separator !== null
        ? `The columns are separated by ${separator}; save the file as CSV with commas between the columns.`
        : `This does not look like a lots CSV file: its first line must be the header row, ${LOT_CSV_COLUMNS.join(',')}.`;
    return [{ line: 1, message }];
  }
  const errors: LotCsvError[] = [];
  const seen = new Set<string>();
  const repeated = new Set<string>();
  for (const h of known) {
    if (seen.has(h)) repeated.add(h);
    seen.add(h);
  }
  if (repeated.size > 0) {
    errors.push({ line: 1, message: `These columns appear more than once: ${listNames([...repeated])}.` });
  }
  const unknown = [...new Set(headers.filter((h) => h !== '' && !KNOWN.has(h)))];
  if (unknown.length > 0) {
    errors.push({
      line: 1,
      message: `Unknown columns: ${listNames(unknown)}. Remove them or rename them to one of: ${LOT_CSV_COLUMNS.join(', ')}.`,
    });
  }
  const missing = REQUIRED_COLUMNS.filter((c) => !seen.has(c));
  const undated = DATE_COLUMNS.every((c) => !seen.has(c));
  if (missing.length > 0 || undated) {
    const parts = [
      ...missing.map((c) => `"${c}"`),
      ...(undated ? ['"harvest_date" or "packed_for_season"'] : []),
    ];
    errors.push({ line: 1, message: `Missing columns: ${parts.join(', ')}.` });
  }
  return errors;
}

// ---------------------------------------------------------------------------------------------
// Import

type RawRecord = Record<string, string | string[] | undefined>;

const EXTRA = '__parsed_extra';
const BLANK_PREFIX = '__blank_';
const IGNORED_PREFIX = '__ignored_';

function fail(line: number, message: string): LotCsvParseResult {
  return { ok: false, errors: [{ line, message }] };
}

function cellsOf(record: RawRecord): Record<LotCsvColumn, string> {
  const cells = {} as Record<LotCsvColumn, string>;
  for (const column of LOT_CSV_COLUMNS) {
    const value = record[column];
    cells[column] = typeof value === 'string' ? value : '';
  }
  return cells;
}

/** Problems of the record's shape (quotes, cell count, stray cells); empty when it is sound. */
function shapeErrors(
  record: RawRecord,
  parseErrors: ParseError[],
  width: number,
  line: number,
): LotCsvError[] {
  if (parseErrors.some((e) => e.type === 'Quotes')) {
    return [
      {
        line,
        message:
          'A cell that starts with a double quote is never closed: everything after it was read as one cell. Check the quotes on this line (RFC 4180 §2 rules 5–7).',
      },
    ];
  }
  const errors: LotCsvError[] = [];
  const cellCount = Object.keys(record).filter((k) => k !== EXTRA).length;
  if (cellCount < width) {
    errors.push({
      line,
      message: `This line has ${cellCount} cells but the header has ${width}. Every line needs one cell per column; a line break inside a cell must be within double quotes (RFC 4180 §2 rules 4 and 6).`,
    });
  }
  const extra = record[EXTRA];
  if (Array.isArray(extra) && extra.some((v) => v !== '')) {
    errors.push({
      line,
      message: `This line has ${cellCount + extra.length} cells but the header has ${width}; the cells beyond the last column hold values.`,
    });
  }
  const strayBlank = Object.entries(record).some(([k, v]) => k.startsWith(BLANK_PREFIX) && v !== '');
  if (strayBlank) {
    errors.push({
      line,
      message: 'A column with a blank header cell holds a value on this line: name the column or empty it.',
    });
  }
  return errors;
}

function columnOf(path: readonly PropertyKey[]): string | undefined {
  const first = path[0];
  return typeof first === 'string' ? first : undefined;
}

interface ImportState {
  resolveSpecies: ResolveSpecies;
  /** lower(code) → the line that first used it */
  codeLines: Map<string, number>;
}

type RecordOutcome = { ok: true; row: ParsedLotCsvRow } | { ok: false; errors: LotCsvError[] };

function checkRecord(
  state: ImportState,
  record: RawRecord,
  parseErrors: ParseError[],
  width: number,
  line: number,
): RecordOutcome {
  const shape = shapeErrors(record, parseErrors, width, line);
  if (shape.length > 0) return { ok: false, errors: shape };

  const cells = cellsOf(record);
  const errors: LotCsvError[] = [];
  const parsed = rowSchema.safeParse(cells);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const column = columnOf(issue.path);
      errors.push(
        column === undefined ? { line, message: issue.message } : { line, column, message: issue.message },
      );
    }
  }

  // Checked even when other cells failed, so the user sees every problem of the line at once.
  const speciesName = unprotectCsvText(cells.species);
  let speciesId: string | null = null;
  if (speciesName !== '' && speciesName.length <= 120) {
    const scientificName = unprotectCsvText(cells.scientific_name);
    speciesId = state.resolveSpecies({
      speciesName,
      scientificName: scientificName === '' ? null : scientificName,
    });
    if (speciesId === null) {
      errors.push({
        line,
        column: 'species',
        message: `Unknown species "${speciesName}" — add it to the bank first or use a name from the species list`,
      });
    }
  }

  const code = unprotectCsvText(cells.code);
  if (code !== '') {
    const key = code.toLowerCase();
    const earlier = state.codeLines.get(key);
    if (earlier === undefined) state.codeLines.set(key, line);
    else
      errors.push({
        line,
        column: 'code',
        message: `The code "${code}" is already used on line ${earlier} of this file.`,
      });
  }

  if (!parsed.success || speciesId === null || errors.length > 0) return { ok: false, errors };
  return { ok: true, row: { ...parsed.data, speciesId, line } };
}

function tooManyRows(line: number): LotCsvParseResult {
  const max = MAX_LOT_CSV_ROWS.toLocaleString('en');
  return fail(
    line,
    `The file holds more than ${max} lots; import at most ${max} at a time (split the file).`,
  );
}

/**
 * Reads a lots CSV. `resolveSpecies` maps a row's species names to the bank's species id. Returns
 * every row (with its species id and line) or every error, each with the line and column.
 */
export function parseLotsCsv(text: string, resolveSpecies: ResolveSpecies): LotCsvParseResult {
  const body = text.startsWith(BOM) ? text.slice(1) : text;
  if (body.trim() === '') {
    return fail(1, `The file is empty. A lots CSV starts with the header row: ${LOT_CSV_COLUMNS.join(',')}.`);
  }
  if (body.includes('\u0000')) {
    return fail(
      1,
      'This is not a CSV text file (a spreadsheet workbook, perhaps). Save it as "CSV UTF-8" and try again.',
    );
  }
  const lineAt = lineCounter(body);
  const undecodable = body.indexOf('\uFFFD');
  if (undecodable >= 0) {
    return fail(
      lineAt(undecodable),
      'The file is not UTF-8 text (accented letters came out garbled). Save it as "CSV UTF-8" and try again.',
    );
  }

  const state: ImportState = { resolveSpecies, codeLines: new Map() };
  const headers: string[] = [];
  const firstLine = body.split(LINE_BREAK, 1)[0] ?? '';
  const progress = {
    headerErrors: null as LotCsvError[] | null,
    records: 0,
    tooManyAt: null as number | null,
    breaksInRecord: 0,
    rows: [] as ParsedLotCsvRow[],
    errors: [] as LotCsvError[],
  };
  const headerErrors = (): LotCsvError[] => (progress.headerErrors ??= checkHeader(headers, firstLine));

  Papa.parse<RawRecord>(body, {
    header: true,
    delimiter: ',',
    skipEmptyLines: 'greedy',
    transformHeader: (raw, index) => {
      const name = normalizeHeader(raw);
      headers[index] = name;
      // Unique keys, so papaparse never renames a repeated column behind our back.
      if (name === '') return `${BLANK_PREFIX}${index}`;
      return KNOWN.has(name) && headers.indexOf(name) === index ? name : `${IGNORED_PREFIX}${index}`;
    },
    transform: (value) => {
      // Runs for each cell of a record just before `step` (never for skipped blank lines): the
      // line breaks inside the record's cells say how far its first line is above its last.
      progress.breaksInRecord += countLineBreaks(value);
      return value.trim();
    },
    step: (result, parser) => {
      // meta.cursor is the offset just past the record, including the line break that ends it.
      const { cursor, linebreak } = result.meta;
      const ended = body.slice(cursor - linebreak.length, cursor) === linebreak;
      const line = lineAt(ended ? cursor - linebreak.length : cursor) - progress.breaksInRecord;
      progress.breaksInRecord = 0;
      if (headerErrors().length > 0) {
        parser.abort();
        return;
      }
      progress.records += 1;
      if (progress.records > MAX_LOT_CSV_ROWS) {
        progress.tooManyAt = line;
        parser.abort();
        return;
      }
      const outcome = checkRecord(state, result.data, result.errors, headers.length, line);
      if (outcome.ok) progress.rows.push(outcome.row);
      else progress.errors.push(...outcome.errors);
    },
  });

  const problems = headerErrors();
  if (problems.length > 0) return { ok: false, errors: problems };
  if (progress.tooManyAt !== null) return tooManyRows(progress.tooManyAt);
  if (progress.errors.length > 0) return { ok: false, errors: progress.errors };
  return { ok: true, rows: progress.rows };
}
