import { describe, expect, it } from 'vitest';
import { entrySpace, mondayOf, weeklySpace, type SpaceInputEntry } from '#server/modules/spaces/space-use';

const entry = (over: Partial<SpaceInputEntry> = {}): SpaceInputEntry => ({
  id: '00000000-0000-4000-8000-000000000001',
  speciesName: 'Tomato',
  start: 'indoors',
  plantsWanted: 10,
  seedsToSow: 12,
  sowFrom: '2027-03-25',
  sownOn: null,
  hardenFrom: '2027-05-20',
  transplantOn: '2027-05-27',
  ...over,
});

describe('room under the lights, entry by entry', () => {
  it('when a day is given, then its week starts on the Monday on or before it (ISO 8601)', () => {
    // Weekdays checked against GNU date: 12 Apr 2027 is a Monday, 18 Apr a Sunday.
    expect(mondayOf('2027-04-12')).toBe('2027-04-12');
    expect(mondayOf('2027-04-15')).toBe('2027-04-12');
    expect(mondayOf('2027-04-18')).toBe('2027-04-12');
    expect(mondayOf('2027-01-01')).toBe('2026-12-28');
  });

  it('when a sowing is direct, then it takes no room indoors', () => {
    expect(entrySpace(entry({ start: 'direct' }), { potUpWeeks: 3, cellsPerPlant: 4 })).toBeNull();
  });

  it('when it has been sown, then its sown date counts, not its window', () => {
    const e = entrySpace(entry({ sownOn: '2027-03-29' }), { potUpWeeks: 3, cellsPerPlant: 4 })!;
    // 29 Mar + 21 days = 19 Apr.
    expect(e).toMatchObject({ sowOn: '2027-03-29', potUpOn: '2027-04-19', trayCells: 12, potCells: 40 });
  });

  it('when sown straight into pots (0 weeks), then no seed tray, pots from the sowing day', () => {
    const e = entrySpace(entry({ plantsWanted: 6 }), { potUpWeeks: 0, cellsPerPlant: 4 })!;
    expect(e).toMatchObject({ potUpOn: '2027-03-25', trayCells: 0, potCells: 24 });
  });

  it('when potting up would fall after hardening off, then it stays in the seed tray until it goes out', () => {
    const e = entrySpace(entry({ sowFrom: '2027-05-06' }), { potUpWeeks: 3, cellsPerPlant: 4 })!;
    expect(e).toMatchObject({ potUpOn: null, trayCells: 12, potCells: 0, freeOn: '2027-05-20' });
  });

  it('when the species or the seeds are not known, then the stated assumptions are used and said', () => {
    const e = entrySpace(entry({ seedsToSow: null, speciesName: 'Bank pea' }), undefined)!;
    // Hilum's assumption (common practice): potted up after 3 weeks into a 6-pack cell, 2 cells.
    expect(e).toMatchObject({ potUpOn: '2027-04-15', trayCells: 10, potCells: 20 });
    expect(e.notes.join(' ')).toMatch(/Bank pea has no weeks to potting up.*3 weeks into 2 cells/);
    expect(e.notes.join(' ')).toMatch(/one cell per plant wanted/);
  });
});

describe('room under the lights, week by week', () => {
  it('when two sowings overlap mid-week, then the week holds its busiest day', () => {
    const a = entrySpace(entry({ seedsToSow: 12 }), { potUpWeeks: 3, cellsPerPlant: 4 })!;
    const b = entrySpace(entry({ sowFrom: '2027-04-22', plantsWanted: 6 }), {
      potUpWeeks: 0,
      cellsPerPlant: 4,
    })!;
    const weeks = weeklySpace([a, b], 60);
    // a: tray 12 from Thu 25 Mar, pots 40 from Thu 15 Apr; b: pots 24 from Thu 22 Apr; both out 20 May.
    expect(weeks.map((w) => [w.weekStart, w.used, w.overflow])).toEqual([
      ['2027-03-22', 12, false],
      ['2027-03-29', 12, false],
      ['2027-04-05', 12, false],
      ['2027-04-12', 40, false],
      ['2027-04-19', 64, true],
      ['2027-04-26', 64, true],
      ['2027-05-03', 64, true],
      ['2027-05-10', 64, true],
      ['2027-05-17', 64, true],
    ]);
  });

  it('when nothing is sown indoors, then there are no weeks', () => {
    expect(weeklySpace([], 100)).toEqual([]);
  });
});
