import { describe, expect, it } from 'vitest';
import { dayInWords } from '#shared/day-words';
import { resultWords } from '#server/modules/germination/result-words';
import { summarizeTest } from '#server/stats/summarize-test';

describe('days in words', () => {
  it('when an ISO calendar day is written out, then it reads day, short month, year with no time zone shift', () => {
    // The Gregorian calendar (common practice): 29 February exists in 2028, a leap year.
    expect(dayInWords('2027-03-29')).toBe('29 Mar 2027');
    expect(dayInWords('2028-02-29')).toBe('29 Feb 2028');
    expect(dayInWords('2026-12-31')).toBe('31 Dec 2026');
    expect(dayInWords('not a date')).toBe('not a date');
  });
});

describe('the result of a test in words', () => {
  it('when no tray is counted yet, then it says when the first count is due, as a day in words', () => {
    const summary = summarizeTest([
      { id: 'a', seedsSown: 25, checks: [] },
      { id: 'b', seedsSown: 25, checks: [] },
    ]);
    expect(resultWords(summary, '2026-03-12')).toEqual([
      'No counts yet. The first count is due around 12 Mar 2026.',
    ]);
  });
});
