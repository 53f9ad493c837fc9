import { describe, expect, it } from 'vitest';
import { EMPTY_TRAITS } from '#shared/schemas/species';
import { addDays } from '#shared/dates';
import { PlanDateError, comingSeason, planDates } from '#shared/plan-dates';
import { SPECIES_REFERENCE } from '#shared/species-reference';
import { referenceTraits } from '#server/modules/species/reference-sync';

/** A shipped species' traits, as every bank sees them before overriding any. */
const reference = (key: string) => referenceTraits(SPECIES_REFERENCE.find((s) => s.key === key)!);

const petunia = {
  ...EMPTY_TRAITS,
  startMethod: 'indoor' as const,
  startWeeksFrom: 12,
  startWeeksTo: 10,
  firstCountDay: 7,
  finalCountDay: 14,
};

describe('sowing dates back from the frost date', () => {
  it('when a slow bedding flower is started 10–12 weeks before a 05-24 frost, then the window is worked out by hand', () => {
    // Common practice: slow bedding flowers are started 8–12 weeks before the last frost.
    // By hand: 12 weeks = 84 days before 2027-05-24 → 2027-03-01 (May 24 − 24 d = Apr 30,
    // − 30 d = Mar 31, − 30 d = Mar 1); 10 weeks = 70 days → 2027-03-15.
    const d = planDates({
      season: 2027,
      lastFrost: '05-24',
      marginDays: 10,
      traits: petunia,
      start: 'indoors',
    });
    expect(d.sowFrom).toBe('2027-03-01');
    expect(d.sowTo).toBe('2027-03-15');
    // No days to emerge set, so the count days stand in (7 and 14; from memory): seedlings from
    // day 7 after the first sowing (03-01 + 7) to day 14 after the last (03-15 + 14 = 03-29).
    expect(d.expectFrom).toBe('2027-03-08');
    expect(d.expectBy).toBe('2027-03-29');
    // Plant out after the frost date plus the 10-day margin, harden off for a week before.
    expect(d.transplantOn).toBe('2027-06-03');
    expect(d.hardenFrom).toBe('2027-05-27');
  });

  it('when the window crosses the end of February in a leap year, then 29 February counts', () => {
    // 2028 is a leap year: 12 weeks before 2028-05-20 is 84 days back → 2028-02-26
    // (May 20 − 20 = Apr 30, − 30 = Mar 31, − 31 = Feb 29, − 3 = Feb 26).
    const leap = planDates({
      season: 2028,
      lastFrost: '05-20',
      marginDays: 0,
      traits: petunia,
      start: 'indoors',
    });
    expect(leap.sowFrom).toBe('2028-02-26');
    // The same in 2027 (common year) lands one day later in the calendar: 2027-02-25.
    const common = planDates({
      season: 2027,
      lastFrost: '05-20',
      marginDays: 0,
      traits: petunia,
      start: 'indoors',
    });
    expect(common.sowFrom).toBe('2027-02-25');
  });

  it('when the frost date is 02-29, then a common year plans from 02-28', () => {
    // The 29 February rule is tested in dates.test.ts; here the plan follows it: 2027-02-28 + 7 days.
    const d = planDates({
      season: 2027,
      lastFrost: '02-29',
      marginDays: 7,
      traits: { ...EMPTY_TRAITS, startMethod: 'direct' },
      start: 'direct',
    });
    expect(d.lastFrost).toBe('2027-02-28');
    expect(d.sowFrom).toBe('2027-03-07');
  });

  it('when sowing direct, then the window opens after the frost date plus margin', () => {
    const d = planDates({
      season: 2027,
      lastFrost: '05-24',
      marginDays: 7,
      traits: { ...EMPTY_TRAITS, startMethod: 'direct' },
      start: 'direct',
    });
    expect(d.sowFrom).toBe('2027-05-31');
    expect(d.sowTo).toBe(addDays('2027-05-31', 21));
    expect(d.transplantOn).toBeNull();
  });

  it('when the bank has no frost date or the species no window, then it says what to set', () => {
    expect(() =>
      planDates({ season: 2027, lastFrost: null, marginDays: 7, traits: petunia, start: 'indoors' }),
    ).toThrow(PlanDateError);
    expect(() =>
      planDates({ season: 2027, lastFrost: '05-24', marginDays: 7, traits: EMPTY_TRAITS, start: 'indoors' }),
    ).toThrow(/indoor start window/);
  });
});

describe('hardiness, days to emerge, successions and sowing days', () => {
  // Hardiness groups: Purdue Extension HO-203 (after University of Illinois VC-14), read through a
  // page quoting it: very hardy (Hilum: hardy) 4–6 weeks before the average last frost, frost
  // tolerant (half-hardy) 2–3 weeks before, tender on or after it, warm loving (very tender)
  // 1–2 weeks after. Last frost 2027-05-24, margin 7 days throughout.
  const at = (
    key: string,
    start: 'indoors' | 'direct',
    extra: Partial<Parameters<typeof planDates>[0]> = {},
  ) =>
    planDates({ season: 2027, lastFrost: '05-24', marginDays: 7, traits: reference(key), start, ...extra });

  it('when pea, carrot, bean and cucumber are sown outside, then each waits as long as its hardiness says', () => {
    // Pea, very hardy: 6 weeks before 05-24 = 04-12, 4 weeks before = 04-26.
    expect(at('pea', 'direct')).toMatchObject({ sowFrom: '2027-04-12', sowTo: '2027-04-26' });
    // Carrot, frost tolerant: 3 weeks before = 05-03, 2 weeks before = 05-10.
    expect(at('carrot', 'direct')).toMatchObject({ sowFrom: '2027-05-03', sowTo: '2027-05-10' });
    // Snap bean, tender: on the frost date plus the bank's 7-day margin, 05-31, for Hilum's 21 days.
    expect(at('bean', 'direct')).toMatchObject({ sowFrom: '2027-05-31', sowTo: '2027-06-21' });
    // Cucumber, warm loving: 1 week after plus the margin, 06-07, for 21 days.
    expect(at('cucumber', 'direct')).toMatchObject({ sowFrom: '2027-06-07', sowTo: '2027-06-28' });
  });

  it('when onion, lettuce and tomato are started indoors, then the hardy ones go out before the tender one', () => {
    // Onion plants, frost tolerant: out 2 weeks before the frost, 05-10 (sown 12–10 weeks before,
    // 03-01 to 03-15, so ready well before); hardened off from a week earlier.
    expect(at('onion', 'indoors')).toMatchObject({
      sowFrom: '2027-03-01',
      sowTo: '2027-03-15',
      transplantOn: '2027-05-10',
      hardenFrom: '2027-05-03',
    });
    // Lettuce, very hardy, could go out 4 weeks before (04-26), but its last sowing is 04-26 too
    // (4 weeks before): out no sooner than 21 days after it (Hilum's rule), 05-17.
    expect(at('lettuce', 'indoors')).toMatchObject({ sowTo: '2027-04-26', transplantOn: '2027-05-17' });
    // Tomato, tender: after the frost plus margin, 05-31.
    expect(at('tomato', 'indoors').transplantOn).toBe('2027-05-31');
  });

  it('when seedlings are expected, then from the days to emerge after the first sowing to the most after the last', () => {
    // Onion days to emergence (Harrington & Minges 1954, in Knott's Handbook): 4 days at 77 °F,
    // 5 at 68 °F. Sown 03-01 to 03-15: seedlings 03-05 to 03-20 — never ending before the window.
    const onion = at('onion', 'indoors');
    expect(onion).toMatchObject({ expectFrom: '2027-03-05', expectBy: '2027-03-20' });
    expect(onion.expectFrom! > onion.sowFrom && onion.expectBy! > onion.sowTo).toBe(true);
    // Sown on 03-10: seedlings 03-14 to 03-15.
    expect(at('onion', 'indoors', { sownOn: '2027-03-10' })).toMatchObject({
      expectFrom: '2027-03-14',
      expectBy: '2027-03-15',
    });
  });

  it('when a sowing is the third of a succession two weeks apart, then all its dates are four weeks later', () => {
    const first = at('lettuce', 'direct');
    const third = at('lettuce', 'direct', { offsetDays: 28 });
    expect(third.sowFrom).toBe(addDays(first.sowFrom, 28));
    expect(third.sowTo).toBe(addDays(first.sowTo, 28));
    expect(third.expectBy).toBe(addDays(first.expectBy!, 28));
  });

  it('when a species has no hardiness, then it is planned as tender and says so', () => {
    const d = planDates({
      season: 2027,
      lastFrost: '05-24',
      marginDays: 7,
      traits: petunia,
      start: 'indoors',
    });
    expect(d.transplantOn).toBe('2027-05-31');
    expect(d.notes.join(' ')).toMatch(/hardiness is not set/);
  });
});

describe('the season planned by default', () => {
  it('when it is spring or summer, then this year’s season; from September, next year’s (Hilum’s rule)', () => {
    expect(comingSeason('2027-03-15')).toBe(2027);
    expect(comingSeason('2026-08-31')).toBe(2026);
    expect(comingSeason('2026-09-01')).toBe(2027);
    expect(comingSeason('2026-12-02')).toBe(2027);
  });
});
