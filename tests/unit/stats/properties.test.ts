import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  clopperPearsonInterval,
  germinationTiming,
  summarizeTest,
  wilsonInterval,
} from '#server/stats/index';
import type { GerminationCheck, AssayTray } from '#server/stats/index';

// Property tests (fast-check 4.11.0) with a fixed seed, so every run draws the same cases. The
// properties are those any confidence interval for a proportion, and any timing measure defined on
// (day, new germinants) pairs, must have (Newcombe 1998, Stat. Med. 17:857–872, on interval
// behaviour; Ranal & Santana 2006, Revista Brasil. Bot. 29:1–11, for the timing measures).
const RUNS = { numRuns: 200, seed: 42 } as const;
/** For properties that summarize whole tests (each run is heavier). */
const FEWER_RUNS = { numRuns: 100, seed: 42 } as const;

const methods = [
  ['Wilson', wilsonInterval],
  ['Clopper–Pearson', clopperPearsonInterval],
] as const;

/** (x, n) with 0 ≤ x ≤ n and 1 ≤ n ≤ maxN. */
function counts(maxN: number): fc.Arbitrary<[number, number]> {
  return fc
    .integer({ min: 1, max: maxN })
    .chain((n) => fc.tuple(fc.integer({ min: 0, max: n }), fc.constant(n)));
}

const confidence = fc.double({ min: 0.5, max: 0.999, noNaN: true });

/** Valid checks: distinct days (quarter days up to day 40), cumulative counts that never fall. */
const checksArbitrary: fc.Arbitrary<GerminationCheck[]> = fc
  .uniqueArray(fc.integer({ min: 1, max: 160 }), { maxLength: 14 })
  .chain((quarters) =>
    fc.tuple(
      fc.constant([...quarters].sort((a, b) => a - b)),
      fc.array(fc.nat(40), { minLength: quarters.length, maxLength: quarters.length }),
      fc.boolean(),
    ),
  )
  .map(([quarters, fresh, withSowingDay]) => {
    let total = 0;
    const checks = quarters.map((q, i) => ({ day: q / 4, cumulative: (total += fresh[i] ?? 0) }));
    return withSowingDay ? [{ day: 0, cumulative: 0 }, ...checks] : checks;
  });

function shuffled<T>(items: readonly T[]): fc.Arbitrary<T[]> {
  return fc.shuffledSubarray([...items], { minLength: items.length, maxLength: items.length });
}

/** One tray: its counts never exceed the seeds sown; an empty check list is a tray not yet counted. */
const trayArbitrary = (id: string): fc.Arbitrary<AssayTray> =>
  fc.tuple(fc.integer({ min: 1, max: 200 }), checksArbitrary).map(([seedsSown, checks]) => ({
    id,
    seedsSown,
    checks: checks.map((c) => ({ day: c.day, cumulative: Math.min(c.cumulative, seedsSown) })),
  }));

const traysArbitrary: fc.Arbitrary<AssayTray[]> = fc
  .integer({ min: 1, max: 6 })
  .chain((k) => fc.tuple(...Array.from({ length: k }, (_, i) => trayArbitrary(`tray-${String(i)}`))));

describe.each(methods)('%s interval properties', (_name, interval) => {
  it('when x of n succeed (0 ≤ x ≤ n ≤ 2000), then the interval contains x/n and lies within [0, 1]', () => {
    fc.assert(
      fc.property(counts(2000), confidence, ([x, n], level) => {
        const { low, high } = interval(x, n, level);
        const p = x / n;
        expect(low).toBeGreaterThanOrEqual(0);
        expect(high).toBeLessThanOrEqual(1);
        expect(low).toBeLessThanOrEqual(p);
        expect(high).toBeGreaterThanOrEqual(p);
        expect(low).toBeLessThan(high);
      }),
      RUNS,
    );
  });

  it('when n grows fourfold at the same proportion, then the interval is strictly narrower', () => {
    fc.assert(
      fc.property(counts(500), confidence, ([x, n], level) => {
        const small = interval(x, n, level);
        const large = interval(4 * x, 4 * n, level);
        expect(large.high - large.low).toBeLessThan(small.high - small.low);
      }),
      RUNS,
    );
  });

  it('when the confidence level rises, then the interval does not shrink', () => {
    // Nested levels: a higher level's interval contains the lower level's. The levels differ by at
    // least 1e-4, far above the bounds' numerical accuracy.
    const levels = fc
      .tuple(
        fc.double({ min: 0.5, max: 0.99, noNaN: true }),
        fc.double({ min: 1e-4, max: 0.009, noNaN: true }),
      )
      .map(([a, d]) => [a, a + d] as const);
    fc.assert(
      fc.property(counts(2000), levels, ([x, n], [lower, higher]) => {
        const narrow = interval(x, n, lower);
        const wide = interval(x, n, higher);
        expect(wide.low).toBeLessThanOrEqual(narrow.low);
        expect(wide.high).toBeGreaterThanOrEqual(narrow.high);
      }),
      RUNS,
    );
  });
});

describe('germinationTiming properties', () => {
  it('when the checks are shuffled, then every timing measure is unchanged', () => {
    fc.assert(
      fc.property(
        checksArbitrary.chain((checks) => fc.tuple(fc.constant(checks), shuffled(checks))),
        ([checks, reordered]) => {
          expect(germinationTiming(reordered)).toEqual(germinationTiming(checks));
        },
      ),
      RUNS,
    );
  });
});

describe('summarizeTest properties', () => {
  it('when the trays are reordered, then the summary is unchanged apart from the order of trayPercents', () => {
    fc.assert(
      fc.property(
        traysArbitrary.chain((trays) => fc.tuple(fc.constant(trays), shuffled(trays))),
        fc.constantFrom('wilson' as const, 'clopper-pearson' as const),
        ([trays, reordered], intervalMethod) => {
          const { trayPercents, homogeneity, ...rest } = summarizeTest(trays, { intervalMethod });
          const again = summarizeTest(reordered, { intervalMethod });
          const byId = (a: { id: string }, b: { id: string }) => a.id.localeCompare(b.id);
          expect([...again.trayPercents].sort(byId)).toEqual([...trayPercents].sort(byId));
          expect(again.trayPercents.map((t) => t.id)).toEqual(reordered.map((t) => t.id));
          const { trayPercents: _tp, homogeneity: otherHomogeneity, ...otherRest } = again;
          expect(otherRest).toEqual(rest);
          // The chi-square statistic is a floating-point sum over trays; reordering may move its last bits.
          if (homogeneity === null) {
            expect(otherHomogeneity).toBeNull();
          } else {
            expect(otherHomogeneity?.df).toBe(homogeneity.df);
            expect(otherHomogeneity?.statistic).toBeCloseTo(homogeneity.statistic, 10);
            expect(otherHomogeneity?.pValue).toBeCloseTo(homogeneity.pValue, 12);
          }
        },
      ),
      RUNS,
    );
  });

  it('when any trays are summarized, then the summary is plain JSON (no undefined, NaN or infinity)', () => {
    // The summary is stored as JSON and read everywhere: it must survive the round trip unchanged.
    fc.assert(
      fc.property(traysArbitrary, (trays) => {
        const summary = summarizeTest(trays);
        expect(JSON.parse(JSON.stringify(summary))).toStrictEqual(summary);
      }),
      FEWER_RUNS,
    );
  });

  it('when a tray is set aside, then every pooled figure is as if the tray were not there', () => {
    fc.assert(
      fc.property(traysArbitrary, trayArbitrary('aside'), (trays, aside) => {
        const { trayPercents: _a, traysTotal: _b, traysSetAside: _c, ...without } = summarizeTest(trays);
        const withAside = summarizeTest([...trays, { ...aside, setAsideReason: 'Spilled' }]);
        const { trayPercents, traysTotal, traysSetAside, ...figures } = withAside;
        // The method of judging agreement is decided by the trays that can enter the figures.
        expect(figures).toEqual(without);
        expect(traysSetAside).toBe(1);
        expect(traysTotal).toBe(trays.length + 1);
        expect(trayPercents.at(-1)).toMatchObject({ state: 'set-aside', germinated: null, percent: null });
      }),
      FEWER_RUNS,
    );
  });
});
