import { describe, expect, it } from 'vitest';
import {
  ASSAY_CSV_COLUMNS,
  parseAssaysCsv,
  assayReferences,
  assaysToCsv,
  type AssayCsvContext,
  type AssayCsvAssay,
} from '#server/modules/germination/assays.csv';
import { uncountedAtFinish } from '#server/modules/germination/count-rules';

// Sources cited below:
// - RFC 4180 §2 [read]: records end with CRLF (rule 1); fields holding commas, double quotes or
//   line breaks are quoted (6), with a double quote inside doubled (7).
// - OWASP, "CSV Injection" [from memory]: cells starting with = + - @ tab or carriage return are
//   read as formulas by spreadsheets; a leading single quote makes them text.
// Fixture lots and tests are invented.

const BOM = '\uFEFF';
const LOTS: Record<string, string> = { 'tom-1': 'lot-tom', 'mar-2': 'lot-mar' };
const context: AssayCsvContext = {
  today: '2026-03-01',
  resolveLot: (code) => LOTS[code.toLowerCase()] ?? null,
};
const HEADER =
  'test,lot_code,start_date,method,tray,seeds_sown,check_date,cumulative,finished_on,abnormal,ungerminated';
const file = (...lines: string[]) => [HEADER, ...lines].join('\r\n');

function finished(): AssayCsvAssay {
  return {
    lotCode: 'TOM-1',
    speciesName: 'Tomato',
    variety: 'Plum, early',
    startDate: '2026-02-01',
    method: '=paper towel',
    medium: 'Towel "A"',
    temperatureC: 21.5,
    lightHours: null,
    pretreatment: 'soak',
    pretreatmentDays: 1,
    notes: 'Line one\nline two',
    finishedOn: '2026-02-12',
    // 7 normal seedlings of the 10 seeds in the figures (tray 2 is set aside): 70%.
    germinationPercent: 70,
    seedsSownEstimated: false,
    trays: [
      {
        position: 1,
        seedsSown: 10,
        abnormal: 1,
        ungerminated: 2,
        fresh: 1,
        dead: 1,
        hard: 0,
        setAsideReason: null,
        counts: [
          { date: '2026-02-05', cumulative: 4 },
          { date: '2026-02-10', cumulative: 7 },
        ],
        sown: counted(10),
        scores: [],
      },
      {
        position: 2,
        seedsSown: 10,
        abnormal: null,
        ungerminated: null,
        fresh: null,
        dead: null,
        hard: null,
        setAsideReason: '-dried out',
        counts: [],
        sown: counted(10),
        scores: [],
      },
    ],
  };
}

function counted(seeds: number) {
  return { by: 'count' as const, seeds, grams: null, about: null, estimate: null };
}

describe('germination tests CSV, export', () => {
  it('when a lot has two tests started the same day, then the second reference gets #2', () => {
    expect(
      assayReferences([
        { lotCode: 'TOM-1', startDate: '2026-02-01' },
        { lotCode: 'TOM-1', startDate: '2026-02-01' },
        { lotCode: 'MAR-2', startDate: '2026-02-01' },
        { lotCode: 'TOM-1', startDate: '2026-02-01' },
      ]),
    ).toEqual(['TOM-1 2026-02-01', 'TOM-1 2026-02-01 #2', 'MAR-2 2026-02-01', 'TOM-1 2026-02-01 #3']);
  });

  it('when a test is written, then each tray has a record per check day, an uncounted tray one with no date, CRLF between them', () => {
    const csv = assaysToCsv([finished()]);
    expect(csv.startsWith(`${BOM}${ASSAY_CSV_COLUMNS.join(',')}\r\n`)).toBe(true); // RFC 4180 §2 rule 1
    const body = csv.slice(BOM.length);
    // The notes' line break is inside quotes (RFC 4180 §2 rule 6), so split on CRLF only.
    const records = body.split('\r\n').slice(1);
    expect(records).toHaveLength(3);
    expect(records[0]).toBe(
      `TOM-1 2026-02-01,TOM-1,Tomato,"Plum, early",2026-02-01,'=paper towel,"Towel ""A""",21.5,,soak,1,"Line one\nline two",1,10,2026-02-05,4,2026-02-12,1,2,1,1,0,,70,no,count,,,,`,
    );
    // The set-aside tray: no counts, no finish values, its reason behind the formula guard (OWASP).
    expect(records[2]).toMatch(/,2,10,,,2026-02-12,,,,,,'-dried out,70,no,count,,,,$/);
  });

  it('when the export is read back, then the test comes back as it was, formula guard removed', () => {
    const {
      speciesName: _species,
      variety: _variety,
      germinationPercent: _percent,
      seedsSownEstimated: _estimated,
      ...assay
    } = finished();
    // How each tray was sown is written for people; the import reads counted trays.
    const trays = assay.trays.map(({ sown: _sown, scores: _scores, ...tray }) => ({
      ...tray,
      seedsSown: tray.seedsSown ?? 0,
    }));
    expect(parseAssaysCsv(assaysToCsv([finished()]), context)).toEqual({
      ok: true,
      assays: [{ ...assay, trays, ref: 'TOM-1 2026-02-01', line: 2, lotId: 'lot-tom' }],
    });
  });

  it('when a file has only the header row, then it reads as no tests', () => {
    expect(parseAssaysCsv(`${BOM}${ASSAY_CSV_COLUMNS.join(',')}\r\n`, context)).toEqual({
      ok: true,
      assays: [],
    });
  });
});

describe('germination tests CSV, import checks', () => {
  const errorsOf = (csv: string) => {
    const result = parseAssaysCsv(csv, context);
    if (result.ok) throw new Error('expected problems');
    return result.errors.map((e) => [e.line, e.column ?? null, e.message]);
  };

  it('when required columns are missing, then the header line names them', () => {
    expect(errorsOf('test,lot_code,method\nx,TOM-1,paper towel\n')).toEqual([
      [1, null, 'Missing columns: "start_date", "tray", "seeds_sown".'],
    ]);
  });

  it('when the records of one test disagree or repeat, then each later line is named', () => {
    const rows = errorsOf(
      file(
        'a,TOM-1,2026-02-01,paper towel,1,10,2026-02-05,3,,,',
        'a,MAR-2,2026-02-01,paper towel,1,12,2026-02-05,3,,,', // 3: other lot, other seeds sown, day repeated
        'a,TOM-1,2026-02-01,petri dish,2,10,,,,,', // 4: other method
      ),
    );
    expect(rows.map(([line, column]) => [line, column])).toEqual([
      [3, 'lot_code'],
      [3, 'seeds_sown'],
      [3, 'check_date'],
      [4, 'method'],
    ]);
  });

  it('when a check date comes without its count, then that line is named', () => {
    expect(errorsOf(file('a,TOM-1,2026-02-01,paper towel,1,10,2026-02-05,,,,'))).toEqual([
      [2, 'cumulative', expect.stringMatching(/^Give both the check date and the cumulative count/)],
    ]);
  });

  it('when seedlings are counted on the start day, then the count rules of the API refuse it', () => {
    expect(errorsOf(file('a,TOM-1,2026-02-01,paper towel,1,10,2026-02-01,2,,,'))).toEqual([
      [2, 'cumulative', expect.stringMatching(/seedlings on the day the test started/)],
    ]);
  });

  it('when a finished tray does not add up, or finish values come without finished_on, then the tray is named', () => {
    const rows = errorsOf(
      file(
        'done,TOM-1,2026-02-01,paper towel,1,10,2026-02-09,6,2026-02-10,1,2', // 6 + 1 + 2 = 9 of 10
        'open,MAR-2,2026-02-01,paper towel,1,10,2026-02-09,6,,1,3',
        'early,MAR-2,2026-02-01,paper towel,1,10,2026-02-09,6,2026-02-08,1,3',
      ),
    );
    expect(rows).toEqual([
      [2, 'ungerminated', 'Tray 1: 6 normal + 1 abnormal + 2 ungerminated = 9, but 10 seeds were sown.'],
      [3, 'finished_on', expect.stringMatching(/give finished_on too/)],
      [4, 'finished_on', 'Test "early" cannot finish before its last count (9 Feb 2026).'],
    ]);
  });

  it('when cold stratification has no days, then the API’s own test schema names the column', () => {
    const csv = [
      'test,lot_code,start_date,method,pretreatment,pretreatment_days,tray,seeds_sown',
      'cold,TOM-1,2026-02-01,paper towel,Cold-Stratification,,1,10',
    ].join('\n');
    expect(errorsOf(csv)).toEqual([[2, 'pretreatment_days', 'Say how many days of cold stratification.']]);
  });

  it('when one line of a test is broken, then only that line is reported, not the test as a whole', () => {
    const rows = errorsOf(
      file(
        'a,TOM-1,2026-02-01,paper towel,1,10,,,,,',
        'a,TOM-1,2026-02-01,paper towel,two,10,,,,,', // tray 2 would be missing if this line were dropped
        'a,TOM-1,2026-02-01,paper towel,3,10,,,,,',
      ),
    );
    expect(rows).toEqual([[3, 'tray', 'Use the tray number, 1 to 8.']]);
  });

  it('when a test starts before its lot was harvested, then that test’s first line says so', () => {
    const withHarvest: AssayCsvContext = {
      ...context,
      harvestDateOf: (lotId) => (lotId === 'lot-tom' ? '2026-02-10' : null),
    };
    const result = parseAssaysCsv(
      file('T1,TOM-1,2026-02-01,paper towel,1,10,,,,,', 'T2,MAR-2,2026-01-15,paper towel,1,10,,,,,'),
      withHarvest,
    );
    expect(result).toEqual({
      ok: false,
      errors: [
        {
          line: 2,
          column: 'start_date',
          message: expect.stringMatching(/before lot TOM-1 was harvested \(10 Feb 2026\)/),
        },
      ],
    });
  });
});

describe('germination tests CSV, set-aside trays and the stored percent', () => {
  const SET_ASIDE_HEADER = `${HEADER},set_aside_reason`;
  const setAsideFile = (...lines: string[]) => [SET_ASIDE_HEADER, ...lines].join('\r\n');
  const errorsOf = (csv: string) => {
    const result = parseAssaysCsv(csv, context);
    if (result.ok) throw new Error('expected problems');
    return result.errors.map((e) => [e.line, e.column ?? null, e.message]);
  };

  it('when germination_percent is edited or left out, then the import reads the same tests (it is written for people only)', () => {
    const csv = assaysToCsv([finished()]);
    const edited = csv.replace(/,70,no,/g, ',12,no,');
    expect(edited).not.toEqual(csv);
    expect(parseAssaysCsv(edited, context)).toEqual(parseAssaysCsv(csv, context));
    const [header, ...rows] = csv.slice(1).split('\r\n');
    // The columns written for people only: the percent and how each tray was sown and scored.
    const cut = (line: string) => line.split(',').slice(0, -7).join(',');
    expect(
      header!.endsWith(
        ',set_aside_reason,germination_percent,seeds_sown_estimated,sown_by,sown_grams,sown_guess,seeds_sown_expected,score',
      ),
    ).toBe(true);
    const dropped = [cut(header!), ...rows.map(cut)].join('\r\n');
    expect(parseAssaysCsv(dropped, context)).toEqual(parseAssaysCsv(csv, context));
  });

  it('when no tray is in the figures yet, then germination_percent is empty', () => {
    const assay = {
      ...finished(),
      finishedOn: null,
      germinationPercent: null,
      trays: [{ ...finished().trays[1]!, setAsideReason: null }],
    };
    const [, record] = assaysToCsv([assay]).slice(1).split('\r\n');
    expect(record).toMatch(/,2,10,,,,,,,,,,,,count,,,,$/);
  });

  it('when a finished test has a tray counted and then set aside, and one never counted set aside, then both read back without finish values', () => {
    const result = parseAssaysCsv(
      setAsideFile(
        'f,TOM-1,2026-02-01,paper towel,1,10,2026-02-09,6,2026-02-10,1,3,',
        'f,TOM-1,2026-02-01,paper towel,2,10,2026-02-05,2,2026-02-10,,,Spilled',
        'f,TOM-1,2026-02-01,paper towel,2,10,2026-02-07,3,2026-02-10,,,', // the reason need not be repeated
        'f,TOM-1,2026-02-01,paper towel,3,10,,,2026-02-10,,,Dried out',
      ),
      context,
    );
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    expect(
      result.assays[0]!.trays.map((t) => [
        t.position,
        t.setAsideReason,
        t.abnormal,
        t.ungerminated,
        t.counts.length,
      ]),
    ).toEqual([
      [1, null, 1, 3, 1],
      [2, 'Spilled', null, null, 2],
      [3, 'Dried out', null, null, 0],
    ]);
  });

  it('when a running test has a tray set aside, then it reads back with its reason', () => {
    const result = parseAssaysCsv(
      setAsideFile(
        'r,MAR-2,2026-02-01,paper towel,1,10,2026-02-05,2,,,,',
        'r,MAR-2,2026-02-01,paper towel,2,10,,,,,,Eaten by mice',
      ),
      context,
    );
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    expect(result.assays[0]!.trays.map((t) => t.setAsideReason)).toEqual([null, 'Eaten by mice']);
  });

  it('when a finished test has a tray never counted and not set aside, then the finish rule of the API asks for a count or a reason', () => {
    expect(
      errorsOf(
        setAsideFile(
          'u,TOM-1,2026-02-01,paper towel,1,10,2026-02-09,6,2026-02-10,1,3,',
          'u,TOM-1,2026-02-01,paper towel,2,10,,,2026-02-10,0,10,', // figures, but never counted
        ),
      ),
    ).toEqual([[3, 'set_aside_reason', uncountedAtFinish(2)]]);
    expect(uncountedAtFinish(2)).toMatch(/^Tray 2 has no counts: .*set it aside with a reason/);
  });

  it('when a tray of a finished test is set aside but gives finish values, then the line asks for one or the other', () => {
    expect(
      errorsOf(
        setAsideFile(
          's,TOM-1,2026-02-01,paper towel,1,10,2026-02-09,6,2026-02-10,1,3,',
          's,TOM-1,2026-02-01,paper towel,2,10,2026-02-05,2,2026-02-10,0,8,spilled',
        ),
      ),
    ).toEqual([
      [
        3,
        'abnormal',
        'Tray 2 is set aside (spilled), so it is left out of the figures and takes no finish values: leave abnormal, ungerminated empty, or empty set_aside_reason to keep the tray in the result.',
      ],
    ]);
  });

  it('when every tray of a finished test is set aside, then the test is refused: it has no result', () => {
    expect(
      errorsOf(
        setAsideFile(
          'all,TOM-1,2026-02-01,paper towel,1,10,2026-02-05,2,2026-02-10,,,mice',
          'all,TOM-1,2026-02-01,paper towel,2,10,,,2026-02-10,,,spilled',
        ),
      ),
    ).toEqual([
      [
        2,
        'set_aside_reason',
        'Test "all" is finished but every tray is set aside, so it has no result: keep at least one counted tray, or leave the test out of the file.',
      ],
    ]);
  });

  it('when a counted tray of a finished test lacks its finish values, then the message offers a reason instead', () => {
    expect(errorsOf(setAsideFile('m,TOM-1,2026-02-01,paper towel,1,10,2026-02-09,6,2026-02-10,,,'))).toEqual([
      [
        2,
        'abnormal',
        'Test "m" is finished: give the abnormal and ungerminated seeds of tray 1, or a set_aside_reason to leave it out.',
      ],
    ]);
  });

  it('when the lines of a tray give different reasons, or one too long, then each such line is named', () => {
    expect(
      errorsOf(
        setAsideFile(
          'd,TOM-1,2026-02-01,paper towel,1,10,2026-02-05,2,,,,spilled',
          'd,TOM-1,2026-02-01,paper towel,1,10,2026-02-07,3,,,,',
          'd,TOM-1,2026-02-01,paper towel,1,10,2026-02-09,4,,,,dried out',
          `long,MAR-2,2026-02-01,paper towel,1,10,,,,,,${'x'.repeat(201)}`,
        ),
      ),
    ).toEqual([
      [
        4,
        'set_aside_reason',
        'Tray 1 gives set_aside_reason spilled on line 2; every line of a tray gives the same.',
      ],
      [5, 'set_aside_reason', 'Keep the reason under 200 characters.'],
    ]);
  });
});
