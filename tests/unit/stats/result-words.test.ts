import { describe, expect, it } from 'vitest';
import { resultWords } from '#server/modules/germination/result-words';
import { summarizeTest } from '#server/stats/index';
import type { AssayTray } from '#server/stats/index';

// The words of a result follow one definition of a seedling (the seed-testing rules count normal
// seedlings; abnormal ones are recorded apart; fresh ungerminated seeds are dormant but alive:
// ISTA Rules ch. 5, 7 CFR 201.21/201.30 for hard seed reported apart) and say which trays are out.

const counted = (id: string, seedsSown: number, day7: number, day14: number): AssayTray => ({
  id,
  seedsSown,
  checks: [
    { day: 7, cumulative: day7 },
    { day: 14, cumulative: day14 },
  ],
});

describe('resultWords', () => {
  it('when two of four trays are counted, then the words say "so far" and name the trays left out', () => {
    const r = summarizeTest([
      counted('a', 100, 40, 80),
      counted('b', 100, 45, 90),
      { id: 'c', seedsSown: 100, checks: [] },
      { id: 'd', seedsSown: 100, checks: [] },
    ]);
    const words = resultWords(r, null);
    expect(words[0]).toBe(
      'About 85% so far — 170 normal seedlings from 200 seeds sown in the counted trays.',
    );
    expect(words).toContain('Trays 3 and 4 are not counted yet and are left out of these figures.');
    const one = resultWords(
      summarizeTest([
        counted('a', 100, 40, 80),
        counted('b', 100, 45, 90),
        { id: 'c', seedsSown: 100, checks: [] },
      ]),
      null,
    );
    expect(one).toContain('Tray 3 is not counted yet and is left out of these figures.');
  });

  it('when a tray is set aside, then its reason is given and it is left out', () => {
    const r = summarizeTest([
      counted('a', 100, 40, 80),
      { ...counted('b', 100, 5, 10), setAsideReason: 'Spilled' },
      counted('c', 100, 45, 90),
    ]);
    const words = resultWords(r, null);
    expect(words).toContain('Tray 2 was set aside (Spilled) and is left out of every figure.');
    expect(words[0]).toContain('170 normal seedlings from 200 seeds');
  });

  it('when the test is finished, then the words are final and give the abnormal and fresh seeds apart', () => {
    const r = summarizeTest([
      { ...counted('a', 100, 40, 85), abnormal: 5, ungerminated: 10, fresh: 6, dead: 4, hard: 0 },
      { ...counted('b', 100, 45, 84), abnormal: 6, ungerminated: 10, fresh: 7, dead: 3, hard: 0 },
    ]);
    const words = resultWords(r, null, true);
    expect(words.join(' ')).not.toMatch(/so far/);
    expect(words[0]).toBe('Germination: 85% — 169 normal seedlings from 200 seeds sown.'); // 84.5 rounds up (ISTA Rules ch. 5)
    expect(words).toContain(
      '11 seedlings were abnormal (stunted or deformed): recorded apart, not in the germination.',
    );
    expect(words.find((w) => w.startsWith('20 seeds did not germinate'))).toMatch(
      /13 were fresh — dormant but alive/,
    );
    expect(words.find((w) => w.startsWith('20 seeds did not germinate'))).toMatch(/7 were dead/);
  });

  it('when trays differ in size, then the agreement words name the chi-square test', () => {
    const r = summarizeTest([counted('a', 10, 2, 3), counted('b', 190, 100, 171)]);
    const words = resultWords(r, null);
    expect(
      words.some((w) =>
        w.startsWith(
          'The trays differ more than chance explains for trays of these sizes (chi-square test, p < 0.001)',
        ),
      ),
    ).toBe(true);
    const agree = resultWords(summarizeTest([counted('a', 10, 5, 9), counted('b', 190, 100, 171)]), null);
    expect(agree.some((w) => w.includes('The trays agree') && w.includes('chi-square test, p = 1.00'))).toBe(
      true,
    );
  });

  it('when there is only a final count, then no timing figure is stated and the note explains why', () => {
    const r = summarizeTest([
      { id: 'a', seedsSown: 50, checks: [{ day: 14, cumulative: 40 }] },
      { id: 'b', seedsSown: 50, checks: [{ day: 14, cumulative: 42 }] },
    ]);
    const words = resultWords(r, null, true);
    expect(words.join(' ')).not.toMatch(/Half of the seedlings that came up had appeared/);
    expect(words.join(' ')).not.toMatch(/On average a seedling took/);
    expect(words).toContain(r.timingNote);
  });

  it('when nothing is counted yet, then it says how to count', () => {
    const r = summarizeTest([{ id: 'a', seedsSown: 25, checks: [] }]);
    expect(resultWords(r, null)).toEqual([
      'No counts yet. On each check day, count the normal seedlings in each tray — those with a sound root and shoot.',
    ]);
  });
});
