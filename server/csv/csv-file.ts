/**
 * The CSV file rules every Hilum CSV (lots, germination tests) shares. Pure: no database, no I/O.
 * Each format module (server/modules/lots/lots.csv.ts, server/modules/germination/assays.csv.ts)
 * describes its own columns and cells; this module writes and reads the file around them.
 *
 * - One header row, then one record per line. Commas between cells; a cell holding a comma, a
 *   double quote or a line break is put in double quotes, with quotes inside doubled; records end
 *   with CRLF (RFC 4180 §2, rules 1, 6 and 7).
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
 *   purpose because stray spaces in hand-edited sheets are mistakes far more often than data.
 * - Header names may come in any order and any letter case; spaces and hyphens in them count as
 *   underscores ("Seeds on hand" = seeds_on_hand). A column we do not know is an error that names
 *   it (ignoring it would silently drop whatever the user typed there); a column whose header cell
 *   is blank is allowed only while all its cells are blank (spreadsheets sometimes add one). A
 *   column the format does not require may be left out; its cells then read as empty.
 * - `line` is the 1-based line of the file on which a record starts, header = line 1, counting
 *   every line break including those inside quoted cells (what a text editor shows). A
 *   spreadsheet's row number is the same unless an earlier cell holds a line break.
 * - Every record is checked and every problem reported, not just the first.
 * - A file with only the header row has zero records (ok), so an export of an empty bank
 *   re-imports cleanly.
 */
import Papa from 'papaparse';
import type { ParseError } from 'papaparse';

export interface CsvError {
  line: number;
  column?: string;
  message: string;
}

/** What a format tells the reader about itself. */
export interface CsvLayout<C extends string> {
  /** Every column, in export order. */
  columns: readonly C[];
  /** "lots", "germination tests": what the file holds, in messages. */
  what: string;
  /** The required columns missing from a header (each as it should be named in a message). */
  missing: (seen: ReadonlySet<string>) => string[];
  /** The most records read; beyond it the whole file is refused. */
  maxRecords: number;
  /** The message for a file with more than `maxRecords` records. */
  tooMany: string;
}

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

export const BOM = '\uFEFF';

export function textCell(value: string | null): string {
  return value === null ? '' : protectCsvText(value);
}

export function numberCell(value: number | null): string {
  return value === null ? '' : String(value);
}

export function yesNoCell(value: boolean): string {
  return value ? 'yes' : 'no';
}

/** The file: BOM, header row, one record per entry of `records`, CRLF between them. */
export function writeCsv<C extends string>(columns: readonly C[], records: Record<C, string>[]): string {
  const data = records.map((cells) => columns.map((column) => cells[column]));
  return BOM + Papa.unparse({ fields: [...columns], data }, { newline: '\r\n' });
}

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

function checkHeader<C extends string>(
  layout: CsvLayout<C>,
  headers: readonly string[],
  firstLine: string,
): CsvError[] {
  const knownNames = new Set<string>(layout.columns);
  const known = headers.filter((h) => knownNames.has(h));
  if (known.length === 0) {
    const separator = firstLine.includes(';') ? 'semicolons' : firstLine.includes('\t') ? 'tabs' : null;
    const message =
      separator !== null
        ? `The columns are separated by ${separator}; save the file as CSV with commas between the columns.`
        : `This does not look like a ${layout.what} CSV file: its first line must be the header row, ${layout.columns.join(',')}.`;
    return [{ line: 1, message }];
  }
  const errors: CsvError[] = [];
  const seen = new Set<string>();
  const repeated = new Set<string>();
  for (const h of known) {
    if (seen.has(h)) repeated.add(h);
    seen.add(h);
  }
  if (repeated.size > 0) {
    errors.push({ line: 1, message: `These columns appear more than once: ${listNames([...repeated])}.` });
  }
  const unknown = [...new Set(headers.filter((h) => h !== '' && !knownNames.has(h)))];
  if (unknown.length > 0) {
    errors.push({
      line: 1,
      message: `Unknown columns: ${listNames(unknown)}. Remove them or rename them to one of: ${layout.columns.join(', ')}.`,
    });
  }
  const missing = layout.missing(seen);
  if (missing.length > 0) errors.push({ line: 1, message: `Missing columns: ${missing.join(', ')}.` });
  return errors;
}

// ---------------------------------------------------------------------------------------------
// Import

type RawRecord = Record<string, string | string[] | undefined>;

const EXTRA = '__parsed_extra';
const BLANK_PREFIX = '__blank_';
const IGNORED_PREFIX = '__ignored_';

function cellsOf<C extends string>(columns: readonly C[], record: RawRecord): Record<C, string> {
  const cells = {} as Record<C, string>;
  for (const column of columns) {
    const value = record[column];
    cells[column] = typeof value === 'string' ? value : '';
  }
  return cells;
}

/** Problems of the record's shape (quotes, cell count, stray cells); empty when it is sound. */
function shapeErrors(record: RawRecord, parseErrors: ParseError[], width: number, line: number): CsvError[] {
  if (parseErrors.some((e) => e.type === 'Quotes')) {
    return [
      {
        line,
        message:
          'A cell that starts with a double quote is never closed: everything after it was read as one cell. Check the quotes on this line (RFC 4180 §2 rules 5–7).',
      },
    ];
  }
  const errors: CsvError[] = [];
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

/** The column a zod issue is about: the first step of its path. */
export function columnOf(path: readonly PropertyKey[]): string | undefined {
  const first = path[0];
  return typeof first === 'string' ? first : undefined;
}

const fail = (line: number, message: string) => ({ ok: false as const, errors: [{ line, message }] });

/**
 * Reads a CSV file laid out as `layout` says, handing each sound record's cells (every column of
 * the layout, '' where the file has none) and its line to `onRecord`, which returns the record's
 * problems. Returns ok, or every problem of the file: the header's, the records' shapes and what
 * `onRecord` found.
 */
export function readCsv<C extends string>(
  text: string,
  layout: CsvLayout<C>,
  onRecord: (cells: Record<C, string>, line: number) => CsvError[],
): { ok: true } | { ok: false; errors: CsvError[] } {
  const body = text.startsWith(BOM) ? text.slice(1) : text;
  if (body.trim() === '') {
    return fail(
      1,
      `The file is empty. A ${layout.what} CSV starts with the header row: ${layout.columns.join(',')}.`,
    );
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

  const known = new Set<string>(layout.columns);
  const headers: string[] = [];
  const firstLine = body.split(LINE_BREAK, 1)[0] ?? '';
  const progress = {
    headerErrors: null as CsvError[] | null,
    records: 0,
    tooManyAt: null as number | null,
    breaksInRecord: 0,
    errors: [] as CsvError[],
  };
  const headerErrors = (): CsvError[] => (progress.headerErrors ??= checkHeader(layout, headers, firstLine));

  Papa.parse<RawRecord>(body, {
    header: true,
    delimiter: ',',
    skipEmptyLines: 'greedy',
    transformHeader: (raw, index) => {
      const name = normalizeHeader(raw);
      headers[index] = name;
      // Unique keys, so papaparse never renames a repeated column behind our back.
      if (name === '') return `${BLANK_PREFIX}${index}`;
      return known.has(name) && headers.indexOf(name) === index ? name : `${IGNORED_PREFIX}${index}`;
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
      if (progress.records > layout.maxRecords) {
        progress.tooManyAt = line;
        parser.abort();
        return;
      }
      const shape = shapeErrors(result.data, result.errors, headers.length, line);
      if (shape.length > 0) progress.errors.push(...shape);
      else progress.errors.push(...onRecord(cellsOf(layout.columns, result.data), line));
    },
  });

  const problems = headerErrors();
  if (problems.length > 0) return { ok: false, errors: problems };
  if (progress.tooManyAt !== null) return fail(progress.tooManyAt, layout.tooMany);
  if (progress.errors.length > 0) return { ok: false, errors: progress.errors };
  return { ok: true };
}
