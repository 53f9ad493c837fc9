/**
 * CSV export and import of a bank's seed lots. Pure: no database, no I/O. The import route wraps
 * the write in one transaction; this module's part of "all or nothing" is that `parseLotsCsv`
 * returns either every row or every error it found (all rows checked, not just up to the first).
 *
 * The file rules every Hilum CSV shares (RFC 4180 quoting, BOM, formula guard, trimmed cells,
 * header matching, line numbers) are in server/csv/csv-file.ts. What is particular to lots:
 * - One record per lot, with the columns in `LOT_CSV_COLUMNS`. Required columns: species,
 *   variety, origin, seeds_on_hand, and harvest_date or packed_for_season. Any other column may be
 *   left out; its cells then read as empty (so a file from before a column existed, such as
 *   `treated`, still imports: its lots are not treated).
 * - Trimming means leading and trailing spaces (and line breaks) of a text value do not survive a
 *   round trip.
 * - Lot codes repeat case-insensitively (the database's unique index is on lower(code)), so
 *   "tom-1" and "TOM-1" in one file is a duplicate, reported on the later line.
 * - An empty seeds_on_hand means the amount is not known (not zero); quantity_estimated yes with a
 *   number means "about" that many.
 * - A file with only the header row parses to zero rows (ok); the route reports "0 lots imported".
 * - Cell values: yes/no (quantity_estimated, treated) also as true/false/1/0, in any letter case
 *   (empty = no); origin, storage_place and status in any letter case; numbers with a point as
 *   decimal separator.
 */
import { z } from 'zod';
import {
  blankToNull,
  choice,
  decimal,
  optionalText,
  requiredText,
  wholeNumber,
  yesNo,
} from '#server/csv/csv-cells';
import {
  columnOf,
  numberCell,
  protectCsvText,
  readCsv,
  textCell,
  unprotectCsvText,
  writeCsv,
  yesNoCell,
  type CsvError,
  type CsvLayout,
} from '#server/csv/csv-file';
import { lotCodeSchema, lotStatusSchema, originSchema, storagePlaceSchema } from '#shared/schemas/lots';

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
  /** Empty when the amount is not known (never read as zero). */
  seedsOnHand: number | null;
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
export type LotCsvError = CsvError;
export type LotCsvParseResult = { ok: true; rows: ParsedLotCsvRow[] } | { ok: false; errors: LotCsvError[] };
/** Finds the bank's species for a row's names; null when there is none. */
export type ResolveSpecies = (name: { speciesName: string; scientificName: string | null }) => string | null;

/** The file's layout, for the shared reader (server/csv/csv-file.ts). */
const LAYOUT: CsvLayout<LotCsvColumn> = {
  columns: LOT_CSV_COLUMNS,
  what: 'lots',
  missing: (seen) => [
    ...REQUIRED_COLUMNS.filter((c) => !seen.has(c)).map((c) => `"${c}"`),
    ...(DATE_COLUMNS.every((c) => !seen.has(c)) ? ['"harvest_date" or "packed_for_season"'] : []),
  ],
  maxRecords: MAX_LOT_CSV_ROWS,
  tooMany: `The file holds more than ${MAX_LOT_CSV_ROWS.toLocaleString('en')} lots; import at most ${MAX_LOT_CSV_ROWS.toLocaleString('en')} at a time (split the file).`,
};

export { protectCsvText, unprotectCsvText };

// ---------------------------------------------------------------------------------------------
// Export

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
  return writeCsv(LOT_CSV_COLUMNS, rows.map(toCells));
}

// ---------------------------------------------------------------------------------------------
// One row's cells → a lot (zod)

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
    seeds_on_hand: z.preprocess(
      blankToNull,
      wholeNumber(
        0,
        10_000_000,
        'Use a whole number of seeds from 0 to 10,000,000, like 250, or leave it empty when the amount is not known.',
      ).nullable(),
    ),
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
    treated: yesNo('Use yes (the seed is coated with fungicide or another treatment) or no; empty means no.'),
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
// Import

interface ImportState {
  resolveSpecies: ResolveSpecies;
  /** lower(code) → the line that first used it */
  codeLines: Map<string, number>;
}

type RecordOutcome = { ok: true; row: ParsedLotCsvRow } | { ok: false; errors: LotCsvError[] };

function checkRecord(state: ImportState, cells: Record<LotCsvColumn, string>, line: number): RecordOutcome {
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

/**
 * Reads a lots CSV. `resolveSpecies` maps a row's species names to the bank's species id. Returns
 * every row (with its species id and line) or every error, each with the line and column.
 */
export function parseLotsCsv(text: string, resolveSpecies: ResolveSpecies): LotCsvParseResult {
  const state: ImportState = { resolveSpecies, codeLines: new Map() };
  const rows: ParsedLotCsvRow[] = [];
  const read = readCsv(text, LAYOUT, (cells, line) => {
    const outcome = checkRecord(state, cells, line);
    if (!outcome.ok) return outcome.errors;
    rows.push(outcome.row);
    return [];
  });
  return read.ok ? { ok: true, rows } : read;
}
