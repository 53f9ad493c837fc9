import { describe, expect, it } from 'vitest';
import {
  LOT_CSV_COLUMNS,
  MAX_LOT_CSV_ROWS,
  lotsToCsv,
  parseLotsCsv,
  protectCsvText,
  unprotectCsvText,
  type LotCsvParseResult,
  type LotCsvRow,
  type ParsedLotCsvRow,
  type ResolveSpecies,
} from '#server/modules/lots/lots.csv';

// Sources cited below:
// - RFC 4180, "Common Format and MIME Type for Comma-Separated Values (CSV) Files", §2 rules 1–7
//   [read]: records end with CRLF (1); the last record may lack it (2); the first line may be a
//   header (3); same number of fields on each line, spaces belong to the field (4); fields may be
//   quoted (5); fields holding line breaks, double quotes or commas are quoted (6); a double quote
//   inside a quoted field is doubled (7).
// - OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): cells starting with
//   = + - @ tab (0x09) or carriage return (0x0D) are read as formulas; prepend a single quote
//   [from memory; the same character list is quoted by secondary pages, read]. OWASP ASVS 5.0
//   requirement 1.2.10 [read] asks for the same single-quote escape of = + - @ and tab.
// Fixture lots are invented demo data.

const BOM = '\uFEFF';
const HEADER = LOT_CSV_COLUMNS.join(',');

/** The bank's species, by common name (invented ids). */
const SPECIES: Record<string, string> = {
  tomato: '00000000-0000-4000-8000-000000000001',
  lettuce: '00000000-0000-4000-8000-000000000002',
  marigold: '00000000-0000-4000-8000-000000000003',
};
const resolve: ResolveSpecies = ({ speciesName }) => SPECIES[speciesName.toLowerCase()] ?? null;

function lot(overrides: Partial<LotCsvRow> = {}): LotCsvRow {
  return {
    code: 'TOM-2025-01',
    speciesName: 'Tomato',
    scientificName: 'Solanum lycopersicum',
    variety: 'Lantern Red',
    origin: 'saved',
    sourceName: null,
    harvestDate: '2025-09-14',
    packedForSeason: 2026,
    seedsOnHand: 340,
    quantityEstimated: false,
    plantsBulked: 6,
    storagePlace: 'fridge',
    storageLocation: 'Blue tin, shelf 2',
    storageTempC: 4.5,
    storageHumidityPct: 35,
    status: 'active',
    treated: false,
    notes: null,
    ...overrides,
  };
}

function rowsOf(result: LotCsvParseResult): ParsedLotCsvRow[] {
  if (!result.ok) throw new Error(`expected ok, got ${JSON.stringify(result.errors)}`);
  return result.rows;
}

function errorsOf(result: LotCsvParseResult) {
  if (result.ok) throw new Error('expected errors, got ok');
  return result.errors;
}

function withoutImportFields(rows: ParsedLotCsvRow[]): LotCsvRow[] {
  return rows.map(({ speciesId: _speciesId, line: _line, ...row }) => row);
}

/** A data line in LOT_CSV_COLUMNS order from a few named cells (others empty). */
function line(cells: Partial<Record<(typeof LOT_CSV_COLUMNS)[number], string>>): string {
  return LOT_CSV_COLUMNS.map((c) => cells[c] ?? '').join(',');
}

const GOOD = {
  species: 'Tomato',
  variety: 'Lantern Red',
  origin: 'saved',
  harvest_date: '2025-09-14',
  seeds_on_hand: '120',
};

describe('lots CSV: export', () => {
  it('when lots are exported, then the file is a BOM, the header in order and one CRLF-ended record per lot', () => {
    const csv = lotsToCsv([
      lot(),
      lot({ code: 'LET-2025-01', speciesName: 'Lettuce', scientificName: null }),
    ]);

    expect(csv.startsWith(BOM)).toBe(true); // UTF-8 byte order mark for spreadsheet programs (common practice)
    const records = csv.slice(1).split('\r\n'); // RFC 4180 §2 rule 1: records separated by CRLF
    expect(records[0]).toBe(HEADER); // RFC 4180 §2 rule 3: a header line with the field names
    expect(records).toHaveLength(3); // RFC 4180 §2 rule 2: the last record needs no line break
    // Expected cells written out by hand from the fixture; the location holds a comma, so it is
    // quoted (RFC 4180 §2 rule 6).
    expect(records[1]).toBe(
      'TOM-2025-01,Tomato,Solanum lycopersicum,Lantern Red,saved,,2025-09-14,2026,340,no,6,fridge,"Blue tin, shelf 2",4.5,35,active,no,',
    );
  });

  it('when a lot is treated seed, then its treated cell says yes, and no for the others', () => {
    // No cell holds a comma, so splitting on commas finds the cells.
    const csv = lotsToCsv([
      lot({ treated: true, storageLocation: 'Shelf 2' }),
      lot({ code: 'TOM-2025-02', storageLocation: null }),
    ]);
    const [header, first, second] = csv.slice(1).split('\r\n');
    const column = header!.split(',').indexOf('treated');
    expect(column).toBeGreaterThan(-1);
    expect(first!.split(',')[column]).toBe('yes');
    expect(second!.split(',')[column]).toBe('no');
  });

  it('when a note holds a comma, quotes and a line break, then it is quoted with its quotes doubled', () => {
    const csv = lotsToCsv([lot({ notes: 'Dry, then "sweat" a week\r\nin paper' })]);
    // RFC 4180 §2 rule 6 (quote a field with line breaks, quotes or commas) and rule 7 (double a
    // quote inside a quoted field).
    expect(csv.endsWith(',"Dry, then ""sweat"" a week\r\nin paper"')).toBe(true);
  });

  it('when a text cell starts with = + - @ tab or CR, then it is exported with a leading apostrophe', () => {
    // OWASP "CSV Injection": the formula-trigger characters and the single-quote escape.
    const triggers = ['=SUM(A1)', '+1', '-2 rows', '@here', '\tindented', '\rodd'];
    for (const value of triggers) {
      expect(protectCsvText(value)).toBe(`'${value}`);
    }
    const csv = lotsToCsv([
      lot({ variety: '=SUM(A1)', sourceName: '@swap table', storageLocation: 'Shelf 2', storageTempC: -18 }),
    ]);
    const cells = csv.split('\r\n')[1]?.split(',') ?? [];
    expect(cells[3]).toBe("'=SUM(A1)");
    expect(cells[5]).toBe("'@swap table");
    // A number cell is written from a number: its minus sign is a sign, not text to guard.
    expect(cells[13]).toBe('-18');
  });

  it('when a text cell only looks harmless or already starts with an apostrophe, then the guard stays reversible', () => {
    expect(protectCsvText('Lantern Red')).toBe('Lantern Red');
    expect(protectCsvText("'Tis the season")).toBe("'Tis the season"); // no trigger after the apostrophe
    expect(protectCsvText("'=A1")).toBe("''=A1"); // one more apostrophe, so import can remove exactly one
    for (const value of ['=A1', "'=A1", "''=A1", "'Tis the season", 'Lantern Red', '-', "'"]) {
      expect(unprotectCsvText(protectCsvText(value))).toBe(value);
    }
  });
});

describe('lots CSV: round trip', () => {
  it('when lots are exported and imported again, then the rows come back identical', () => {
    const rows: LotCsvRow[] = [
      lot({ notes: 'Dry, then "sweat" a week\nin paper; from the café plot — très bien' }),
      lot({
        code: null,
        speciesName: 'Lettuce',
        scientificName: 'Lactuca sativa',
        variety: '=SUM(A1)',
        origin: 'swapped',
        sourceName: 'Circle swap, spring',
        harvestDate: null,
        packedForSeason: 2025,
        seedsOnHand: 0,
        quantityEstimated: true,
        plantsBulked: null,
        storagePlace: null,
        storageLocation: null,
        storageTempC: null,
        storageHumidityPct: null,
        status: 'depleted',
        notes: "'=already quoted",
      }),
      lot({
        code: 'MAR-7',
        speciesName: 'Marigold',
        scientificName: null,
        variety: 'Ñandú Gold',
        origin: 'bought',
        storagePlace: 'freezer',
        storageTempC: -18,
        storageHumidityPct: 0,
        status: 'retired',
        treated: true,
        notes: '-5 °C some nights\r\n@ the back, "tin 3"',
      }),
    ];

    const result = parseLotsCsv(lotsToCsv(rows), resolve);

    const parsed = rowsOf(result);
    expect(withoutImportFields(parsed)).toEqual(rows);
    expect(parsed.map((r) => r.speciesId)).toEqual([SPECIES.tomato, SPECIES.lettuce, SPECIES.marigold]);
    // Lines as counted in the file: header 1; the first lot's note spans lines 2–3; the third
    // lot starts on line 5 (RFC 4180 §2 rule 6: a quoted field may hold a line break).
    expect(parsed.map((r) => r.line)).toEqual([2, 4, 5]);
  });

  it('when an empty bank is exported and imported, then it parses to no rows', () => {
    // Choice: a header-only file is ok with zero rows, so an empty export re-imports cleanly.
    expect(rowsOf(parseLotsCsv(lotsToCsv([]), resolve))).toEqual([]);
  });
});

describe('lots CSV: import, header', () => {
  it('when the columns are shuffled and the header case changed, then the file still parses', () => {
    const order = [...LOT_CSV_COLUMNS].reverse();
    const original = lot({ notes: 'kept, "as is"' });
    const header = order.map((c) => c.toUpperCase()).join(',');
    const values: Record<string, string> = {
      code: 'TOM-2025-01',
      species: 'Tomato',
      scientific_name: 'Solanum lycopersicum',
      variety: 'Lantern Red',
      origin: 'saved',
      source_name: '',
      harvest_date: '2025-09-14',
      packed_for_season: '2026',
      seeds_on_hand: '340',
      quantity_estimated: 'no',
      plants_bulked: '6',
      storage_place: 'fridge',
      storage_location: '"Blue tin, shelf 2"',
      storage_temp_c: '4.5',
      storage_humidity_pct: '35',
      status: 'active',
      treated: 'no',
      notes: '"kept, ""as is"""',
    };
    const text = `${header}\r\n${order.map((c) => values[c]).join(',')}\r\n`;

    expect(withoutImportFields(rowsOf(parseLotsCsv(text, resolve)))).toEqual([original]);
  });

  it('when header names use spaces and capitals and optional columns are left out, then it parses', () => {
    const text =
      'Species,Variety,Origin,Harvest Date,Seeds on hand\nLettuce,Crinkle Green,Swapped,2024-07-02,800\n';
    const [row] = rowsOf(parseLotsCsv(text, resolve));
    expect(row).toMatchObject({
      code: null,
      speciesName: 'Lettuce',
      origin: 'swapped',
      harvestDate: '2024-07-02',
      seedsOnHand: 800,
      quantityEstimated: false,
      status: 'active',
      treated: false,
      notes: null,
      line: 2,
    });
  });

  it('when the file starts with a BOM, then the first column is still recognised', () => {
    const text = `${BOM}${HEADER}\r\n${line({ ...GOOD, code: 'TOM-9' })}\r\n`;
    expect(rowsOf(parseLotsCsv(text, resolve))[0]?.code).toBe('TOM-9');
  });

  it('when the file has unknown columns, then one error names them', () => {
    const text = `${HEADER},colour,Weight g\r\n${line(GOOD)},red,3\r\n`;
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.line).toBe(1);
    expect(errors[0]?.message).toContain('"colour", "weight_g"');
  });

  it('when required columns are missing, then one error lists them', () => {
    const text = 'code,species,notes\r\nTOM-1,Tomato,hello\r\n';
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toEqual([
      {
        line: 1,
        message:
          'Missing columns: "variety", "origin", "seeds_on_hand", "harvest_date" or "packed_for_season".',
      },
    ]);
  });

  it('when a column appears twice, then the header is rejected', () => {
    const text = `${HEADER},Notes\r\n${line(GOOD)},again\r\n`;
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.message).toContain('more than once: "notes"');
  });

  it('when a trailing column has a blank header and blank cells, then it is ignored', () => {
    const text = `${HEADER},\r\n${line(GOOD)},\r\n`;
    expect(rowsOf(parseLotsCsv(text, resolve))).toHaveLength(1);
  });
});

describe('lots CSV: import, files that are not lots', () => {
  it.each([
    ['an empty file', ''],
    ['a file with only a BOM', BOM],
    ['a file of blank lines', '\r\n\r\n  \r\n'],
  ])('when %s is imported, then one error says the file is empty', (_name, text) => {
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ line: 1 });
    expect(errors[0]?.message).toMatch(/^The file is empty/);
  });

  it('when a file holds only the header, then it parses to zero rows', () => {
    expect(rowsOf(parseLotsCsv(`${HEADER}\r\n`, resolve))).toEqual([]);
    expect(rowsOf(parseLotsCsv(HEADER, resolve))).toEqual([]); // RFC 4180 §2 rule 2: no final CRLF needed
  });

  it('when a plain letter is imported, then one error says it is not a lots CSV', () => {
    const errors = errorsOf(parseLotsCsv('Dear circle,\nhere are my seeds.\n', resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.message).toMatch(/^This does not look like a lots CSV file/);
  });

  it('when a workbook (binary) is imported, then one error says it is not a CSV text file', () => {
    const errors = errorsOf(parseLotsCsv('PK\u0003\u0004\u0014\u0000\u0006\u0000', resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.message).toMatch(/not a CSV text file/);
  });

  it('when the columns are separated by semicolons, then the error says so', () => {
    const text = 'code;species;variety;origin;harvest_date;seeds_on_hand\nT-1;Tomato;X;saved;2025-09-14;10\n';
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.message).toMatch(/separated by semicolons/);
  });

  it('when text decoded from a non-UTF-8 file holds replacement characters, then the error names the line', () => {
    const text = `${HEADER}\r\n${line({ ...GOOD, notes: 'caf\uFFFD' })}\r\n`;
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.line).toBe(2);
    expect(errors[0]?.message).toMatch(/not UTF-8/);
  });

  it(`when a file holds more than ${MAX_LOT_CSV_ROWS} lots, then it is refused; exactly ${MAX_LOT_CSV_ROWS} is fine`, () => {
    const body = (n: number) =>
      Array.from({ length: n }, (_, i) => line({ ...GOOD, code: `T-${i + 1}` })).join('\r\n');
    expect(rowsOf(parseLotsCsv(`${HEADER}\r\n${body(MAX_LOT_CSV_ROWS)}`, resolve))).toHaveLength(
      MAX_LOT_CSV_ROWS,
    );

    const errors = errorsOf(parseLotsCsv(`${HEADER}\r\n${body(MAX_LOT_CSV_ROWS + 1)}`, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]?.line).toBe(MAX_LOT_CSV_ROWS + 2); // the 5,001st lot, below the header
    expect(errors[0]?.message).toMatch(/more than 5,000 lots/);
  });
});

describe('lots CSV: import, rows', () => {
  it('when one bad row sits among good ones after a multi-line note, then the errors name its line and columns', () => {
    const text = [
      HEADER,
      line({ ...GOOD, code: 'T-1', notes: '"first line\r\nsecond line\r\nthird line"' }), // lines 2–4
      line({ ...GOOD, code: 'T-2' }), // line 5
      line({ ...GOOD, code: 'T-3', harvest_date: '2025-02-30', origin: 'stolen', seeds_on_hand: '-12' }), // line 6
      line({ ...GOOD, code: 'T-4' }), // line 7
    ].join('\r\n');

    const errors = errorsOf(parseLotsCsv(text, resolve));

    // 2025 is not a leap year, so February has 28 days (Gregorian calendar rule).
    // Line 6: a quoted field may span lines (RFC 4180 §2 rule 6), so the third record starts on
    // the sixth line of the file.
    expect(errors.map((e) => [e.line, e.column])).toEqual([
      [6, 'origin'],
      [6, 'harvest_date'],
      [6, 'seeds_on_hand'],
    ]);
    expect(errors.find((e) => e.column === 'origin')?.message).toBe('Use saved, swapped or bought.');
  });

  it('when several rows are bad, then every row gets its errors, not just the first', () => {
    const text = [
      HEADER,
      line({ ...GOOD, variety: '' }),
      line(GOOD),
      line({ ...GOOD, storage_temp_c: '41' }),
      line({ ...GOOD, storage_humidity_pct: '100.5', packed_for_season: '1899' }),
    ].join('\n');

    const errors = errorsOf(parseLotsCsv(text, resolve));

    expect(errors.map((e) => [e.line, e.column])).toEqual([
      [2, 'variety'],
      [4, 'storage_temp_c'],
      [5, 'packed_for_season'],
      [5, 'storage_humidity_pct'],
    ]);
  });

  it('when blank lines and empty-cell lines sit between records, then they are skipped and lines still count', () => {
    const text = [
      HEADER,
      '',
      line({ ...GOOD, code: 'T-1' }),
      ',,,,',
      '   ',
      line({ ...GOOD, code: 'T-2' }),
      '',
    ].join('\n');
    expect(rowsOf(parseLotsCsv(text, resolve)).map((r) => [r.code, r.line])).toEqual([
      ['T-1', 3],
      ['T-2', 6],
    ]);
  });

  it('when a species is not in the bank, then the row gets the unknown-species error', () => {
    const text = [HEADER, line(GOOD), line({ ...GOOD, species: 'Moonflower' })].join('\r\n');
    expect(errorsOf(parseLotsCsv(text, resolve))).toEqual([
      {
        line: 3,
        column: 'species',
        message:
          'Unknown species "Moonflower" — add it to the bank first or use a name from the species list',
      },
    ]);
  });

  it('when the resolver is asked, then it gets the common and scientific names as written', () => {
    const asked: Parameters<ResolveSpecies>[0][] = [];
    const text = [HEADER, line({ ...GOOD, scientific_name: 'Solanum lycopersicum' }), line(GOOD)].join(
      '\r\n',
    );
    parseLotsCsv(text, (name) => {
      asked.push(name);
      return 'x';
    });
    expect(asked).toEqual([
      { speciesName: 'Tomato', scientificName: 'Solanum lycopersicum' },
      { speciesName: 'Tomato', scientificName: null },
    ]);
  });

  it('when a code repeats in the file, in any letter case, then the later line gets the error', () => {
    const text = [
      HEADER,
      line({ ...GOOD, code: 'TOM-1' }),
      line({ ...GOOD, code: 'TOM-2' }),
      line({ ...GOOD, code: 'tom-1' }),
      line(GOOD), // empty codes never clash: the server generates them
      line(GOOD),
    ].join('\r\n');
    expect(errorsOf(parseLotsCsv(text, resolve))).toEqual([
      { line: 4, column: 'code', message: 'The code "tom-1" is already used on line 2 of this file.' },
    ]);
  });

  it('when neither harvest date nor season is given, then the row is refused on harvest_date', () => {
    const text = [HEADER, line({ ...GOOD, harvest_date: '' })].join('\r\n');
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors.map((e) => [e.line, e.column])).toEqual([[2, 'harvest_date']]);
    expect(errors[0]?.message).toMatch(/harvest date or the season/);
  });

  it('when yes/no cells use true/false/1/0 or are empty and choices use capitals, then they are read', () => {
    const text = [
      HEADER,
      line({ ...GOOD, quantity_estimated: 'TRUE', status: 'Retired', storage_place: 'Freezer' }),
      line({ ...GOOD, quantity_estimated: '0', status: '' }),
      line({ ...GOOD, quantity_estimated: '1' }),
      line({ ...GOOD, quantity_estimated: '' }),
      line({ ...GOOD, quantity_estimated: 'maybe' }),
    ].join('\r\n');
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toEqual([{ line: 6, column: 'quantity_estimated', message: 'Use yes or no.' }]);

    const rows = rowsOf(parseLotsCsv(text.split('\r\n').slice(0, 5).join('\r\n'), resolve));
    expect(rows.map((r) => [r.quantityEstimated, r.status, r.storagePlace])).toEqual([
      [true, 'retired', 'freezer'],
      [false, 'active', null],
      [true, 'active', null],
      [false, 'active', null],
    ]);
  });

  it('when the treated cell is spelled yes/no, true/false, 1/0 or left empty, then it is read; anything else fails its row', () => {
    const spellings: [string, boolean][] = [
      ['yes', true],
      ['Yes', true],
      ['TRUE', true],
      ['1', true],
      ['no', false],
      ['False', false],
      ['0', false],
      ['', false],
      [' yes ', true], // cells are trimmed (see the module notes)
    ];
    const good = [HEADER, ...spellings.map(([cell]) => line({ ...GOOD, treated: cell }))].join('\r\n');
    expect(rowsOf(parseLotsCsv(good, resolve)).map((r) => r.treated)).toEqual(
      spellings.map(([, value]) => value),
    );

    const bad = [
      HEADER,
      line({ ...GOOD, treated: 'yes' }),
      line({ ...GOOD, treated: 'coated' }),
      line({ ...GOOD, treated: 'n' }),
    ].join('\r\n');
    const errors = errorsOf(parseLotsCsv(bad, resolve));
    expect(errors.map((e) => [e.line, e.column])).toEqual([
      [3, 'treated'],
      [4, 'treated'],
    ]);
    expect(errors[0]?.message).toBe(
      'Use yes (the seed is coated with fungicide or another treatment) or no; empty means no.',
    );
  });

  it('when a file from before the treated column is imported, then it parses and no lot is treated', () => {
    const older = LOT_CSV_COLUMNS.filter((c) => c !== 'treated');
    const cells: Record<string, string> = { ...GOOD, code: 'TOM-OLD' };
    const text = [older.join(','), older.map((c) => cells[c] ?? '').join(',')].join('\r\n');
    expect(rowsOf(parseLotsCsv(text, resolve)).map((r) => [r.code, r.treated])).toEqual([['TOM-OLD', false]]);
  });

  it('when a hand-typed cell carries the formula apostrophe, then import removes exactly that apostrophe', () => {
    const text = [HEADER, line({ ...GOOD, variety: "'=SUM(A1)", source_name: "'Tis ours" })].join('\r\n');
    const [row] = rowsOf(parseLotsCsv(text, resolve));
    expect(row?.variety).toBe('=SUM(A1)'); // OWASP "CSV Injection": the apostrophe was only the escape
    expect(row?.sourceName).toBe("'Tis ours"); // not an escape: nothing formula-like follows it
  });

  it('when cells have stray spaces, then they are trimmed', () => {
    const text = [HEADER, line({ ...GOOD, variety: '  Lantern Red  ', seeds_on_hand: ' 120 ' })].join('\r\n');
    const [row] = rowsOf(parseLotsCsv(text, resolve));
    // Deliberate deviation from RFC 4180 §2 rule 4 (spaces are part of a field): see the module notes.
    expect([row?.variety, row?.seedsOnHand]).toEqual(['Lantern Red', 120]);
  });

  it('when a line has too few cells, then it is refused with its line', () => {
    const text = [HEADER, line(GOOD), 'TOM-5,Tomato,,Lantern Red'].join('\r\n');
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    // RFC 4180 §2 rule 4: each line has the same number of fields.
    expect(errors[0]).toMatchObject({ line: 3 });
    expect(errors[0]?.message).toMatch(/has 4 cells but the header has 18/);
  });

  it('when a line has extra cells with values, then it is refused; empty extra cells are ignored', () => {
    const text = [HEADER, `${line(GOOD)},`, `${line(GOOD)},surprise`].join('\r\n');
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors.map((e) => e.line)).toEqual([3]);
  });

  it('when a quoted cell is never closed, then the error names the line where it starts', () => {
    const text = [HEADER, line(GOOD), line({ ...GOOD, notes: '"never closed' }), line(GOOD)].join('\r\n');
    const errors = errorsOf(parseLotsCsv(text, resolve));
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ line: 3 });
    expect(errors[0]?.message).toMatch(/never closed/);
  });

  it('when a code breaks the code rules, then the row is refused on code', () => {
    const text = [HEADER, line({ ...GOOD, code: 'T 1!' })].join('\r\n');
    expect(errorsOf(parseLotsCsv(text, resolve)).map((e) => e.column)).toEqual(['code']);
  });
});
