// The hierarchical viability model (server/stats/viability-model.ts) on the lots a grower can have.
// Each case asserts finite, sensible numbers; the bands' calibration is checked by the seeded
// simulation in scripts/check-coverage.ts (npm run check:coverage), not here.
// Reference for the direction of every case: the seed viability equation (Ellis & Roberts 1980,
// Ann. Bot. 45:13–30) — viability falls along a probit line with storage time, never rises.
import { describe, expect, it } from 'vitest';
import { normalCdf } from '#server/stats/distributions';
import {
  fitSpeciesModel,
  logPhi,
  monitoringIntervalYears,
  projectModel,
  type LotModel,
  type ModelLot,
} from '#server/stats/viability-model';

const TOMATO = { typicalLifeYears: 4 }; // ISU Yard & Garden 1999 (Knott's Handbook): tomato 4 years [read]

function fitOne(assays: ModelLot['assays'], others: ModelLot[] = [], prior = TOMATO): LotModel {
  const [first] = fitSpeciesModel([{ id: 'lot', assays }, ...others], prior);
  if (!first?.ok) throw new Error(`not fitted: ${JSON.stringify(first)}`);
  return first.model;
}

function expectSensible(model: LotModel, ages: number[]) {
  for (const age of ages) {
    const b = projectModel(model, age);
    for (const v of [b.percent, b.low, b.high]) {
      expect(Number.isFinite(v)).toBe(true);
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThanOrEqual(100);
    }
    expect(b.low).toBeLessThanOrEqual(b.percent);
    expect(b.high).toBeGreaterThanOrEqual(b.percent);
  }
  expect(Number.isFinite(model.rate) && model.rate > 0).toBe(true);
  expect(Number.isFinite(model.halfLifeYears)).toBe(true);
  expect(model.halfLifeYears).toBeLessThan(200);
  expect(model.initial.high).toBeLessThanOrEqual(99.9 + 1e-9); // initial viability bounded by Φ(3.09)
}

const assay = (id: string, age: number, alive: number, sown = 100) => ({ id, age, alive, sown });

describe('the viability model', () => {
  it('when log Φ is read from its table, then it matches the exact Φ in both tails', () => {
    // Exact values of Φ (Abramowitz & Stegun 1964, table 26.1): Φ(−3) = 0.00134990, Φ(1) = 0.84134475.
    expect(Math.exp(logPhi(-3))).toBeCloseTo(0.0013499, 7);
    expect(Math.exp(logPhi(1))).toBeCloseTo(0.84134475, 6);
    for (const x of [-30, -8.5, -2.2, 0, 0.7, 4.4, 8.9]) {
      expect(Math.abs(logPhi(x) - Math.log(normalCdf(x)))).toBeLessThan(2e-7);
    }
  });

  it('when a lot has one test, then its band is finite and widens with age, borrowing the species rate', () => {
    const m = fitOne([assay('a', 0.5, 90)]);
    expectSensible(m, [0, 0.5, 2, 5, 20]);
    expect(m.basis).toBe('typical');
    const now = projectModel(m, 0.5);
    const later = projectModel(m, 3.5);
    expect(now.percent).toBeGreaterThan(84);
    expect(now.percent).toBeLessThan(95);
    expect(later.percent).toBeLessThan(now.percent);
    expect(later.high - later.low).toBeGreaterThan(now.high - now.low);
  });

  it('when a lot has two close tests (96%, then 95% eight months later), then three years on its band is not 3–100%', () => {
    const m = fitOne([assay('a', 1, 96), assay('b', 1 + 8 / 12, 95)]);
    expectSensible(m, [0, 2, 4.67, 10]);
    const on = projectModel(m, 4.67);
    expect(on.low).toBeGreaterThan(20);
    expect(on.high - on.low).toBeLessThan(60);
  });

  it('when a lot has two equal tests, then its half-life is years, not 10^17', () => {
    const m = fitOne([assay('a', 1, 90), assay('b', 3, 90)]);
    expectSensible(m, [0, 3, 8]);
    expect(m.halfLifeYears).toBeGreaterThan(3);
    expect(m.halfLifeYears).toBeLessThan(60);
  });

  it('when every result is 100%, then the initial viability stays under 99.9% and the decline is finite', () => {
    const m = fitOne([assay('a', 1, 50, 50), assay('b', 2, 50, 50)]);
    expectSensible(m, [0, 2, 6]);
    expect(projectModel(m, 6).percent).toBeLessThan(projectModel(m, 2).percent);
  });

  it('when results rise with age (30% fresh, 95% a year later), then the early test is read as held back, not as decline', () => {
    const m = fitOne([assay('fresh', 0.05, 30), assay('later', 1.05, 95)]);
    expectSensible(m, [0.05, 1.05, 3]);
    expect(m.heldBack).toEqual(['fresh']);
    expect(m.notes.join(' ')).toMatch(/held back by dormancy or by conditions/);
    // On the date of its own 95% test the lot is projected near 95%, not at 59% as before.
    expect(projectModel(m, 1.05).percent).toBeGreaterThan(88);
  });

  it('when a lot rises against the species (a borrowed rate), then nothing becomes NaN and its siblings are unchanged', () => {
    const siblings: ModelLot[] = Array.from({ length: 6 }, (_, j) => ({
      id: `s${j}`,
      assays: [assay(`s${j}a`, 0.5, 92), assay(`s${j}b`, 3, 55)],
    }));
    const alone = fitSpeciesModel(siblings, TOMATO);
    const withOdd = fitSpeciesModel(
      [{ id: 'odd', assays: [assay('o1', 0.2, 8, 20), assay('o2', 2.5, 20, 20)] }, ...siblings],
      TOMATO,
    );
    const odd = withOdd[0]!;
    expect(odd.ok).toBe(true);
    if (odd.ok) expectSensible(odd.model, [0, 2.5, 5]);
    // Each sibling's own projection moves by less than a point: one lot does not decide the species.
    alone.forEach((r, j) => {
      const other = withOdd[j + 1]!;
      if (!r.ok || !other.ok) throw new Error('sibling not fitted');
      expect(Math.abs(projectModel(r.model, 4).percent - projectModel(other.model, 4).percent)).toBeLessThan(
        3,
      );
    });
  });

  it('when one lot was tested 100% then 95%, then its siblings with one test keep sensible bands', () => {
    const results = fitSpeciesModel(
      [
        { id: 'poison', assays: [assay('p1', 1, 100), assay('p2', 2, 95)] },
        { id: 'sib', assays: [assay('x', 0.5, 90)] },
      ],
      TOMATO,
    );
    const sib = results[1]!;
    if (!sib.ok) throw new Error('not fitted');
    const band = projectModel(sib.model, 1.5);
    expect(band.low).toBeGreaterThan(40);
    expect(band.high - band.low).toBeLessThan(50);
  });

  it('when a room lot sits beside freezer lots, then on equivalent age it declines faster per calendar year', () => {
    // The caller scales calendar age by storage: 20 °C ages seed ≈ 1.77× a 15 °C room, −18 °C ≈ 0.09×
    // (Dickie et al. 1990 universal temperature terms, storage-sigma.ts temperatureFactor).
    const freezer = (id: string) => ({
      id,
      assays: [assay(`${id}a`, 0.5 * 0.092, 95), assay(`${id}b`, 4 * 0.092, 94)],
    });
    const results = fitSpeciesModel(
      [{ id: 'room', assays: [assay('r', 0.5 * 1.77, 93)] }, freezer('f1'), freezer('f2')],
      TOMATO,
    );
    const room = results[0]!;
    const cold = results[1]!;
    if (!room.ok || !cold.ok) throw new Error('not fitted');
    // Two calendar years on from each lot's first test.
    const roomIn2 = projectModel(room.model, 2.5 * 1.77).percent;
    const coldIn2 = projectModel(cold.model, 2.5 * 0.092).percent;
    expect(roomIn2).toBeLessThan(coldIn2 - 5);
  });

  it('when a lot has no usable test, then it gets the species estimate with a wide band, marked as an estimate', () => {
    const m = fitOne([]);
    expectSensible(m, [0, 1, 3]);
    expect(m.estimateOnly).toBe(true);
    const band = projectModel(m, 1);
    expect(band.high - band.low).toBeGreaterThan(30);
  });

  it('when a test has impossible counts, then that lot says so and the others are still fitted', () => {
    const results = fitSpeciesModel(
      [
        { id: 'bad', assays: [assay('b', 1, 120)] },
        { id: 'good', assays: [assay('g', 1, 80)] },
      ],
      TOMATO,
    );
    expect(results[0]).toMatchObject({ ok: false, lotId: 'bad' });
    expect(results[1]!.ok).toBe(true);
  });

  it('when the monitoring interval is asked for, then it is a third of the time to fall to 85% of initial', () => {
    const m = fitOne([assay('a', 0.5, 92), assay('b', 2.5, 60)]);
    const years = monitoringIntervalYears(m);
    expect(years).toBeGreaterThan(0.05);
    expect(years).toBeLessThan(3);
  });
});

// Weaker evidence: the direction of each case follows from its likelihood (rough-evidence.ts); the
// size is not asserted beyond "narrower than no evidence, wider than a count".
describe('the viability model with weaker evidence than a count', () => {
  const width = (m: LotModel, age: number) => {
    const b = projectModel(m, age);
    return b.high - b.low;
  };

  it('when a tray is scored "most" or "none", then the lot moves the right way, less surely than a count', () => {
    const none = fitOne([]);
    const most = fitOne([
      { id: 's', age: 0.5, alive: 0, sown: 60, evidence: { kind: 'score', score: 'most' } },
    ]);
    const low = fitOne([
      { id: 's', age: 0.5, alive: 0, sown: 60, evidence: { kind: 'score', score: 'few' } },
    ]);
    const counted = fitOne([assay('c', 0.5, 48, 60)]); // 80%, inside the "most" band
    for (const m of [most, low]) expectSensible(m, [0, 0.5, 3]);
    expect(projectModel(most, 0.5).percent).toBeGreaterThan(projectModel(low, 0.5).percent + 30);
    // "few" is 5–35% (ROUGH_SCORE_BANDS): the lot's figure falls near that band.
    expect(projectModel(low, 0.5).percent).toBeLessThan(40);
    expect(width(most, 0.5)).toBeLessThan(width(none, 0.5));
    expect(width(most, 0.5)).toBeGreaterThan(width(counted, 0.5));
    expect(most.estimateOnly).toBe(false);
    expect(most.notes.join(' ')).toMatch(/No counted test/);
  });

  it('when seedlings came up from a sowing, then it informs the lot more weakly than a test of the same numbers', () => {
    const emergence = fitOne([
      {
        id: 'e',
        age: 0.5,
        alive: 0,
        sown: 100,
        evidence: { kind: 'emergence', emergence: { seedlings: 80 } },
      },
    ]);
    const counted = fitOne([assay('c', 0.5, 80, 100)]);
    const none = fitOne([]);
    expectSensible(emergence, [0, 0.5, 3]);
    // 80 of 100 came up, and only 60–100% of germinating seed emerges (FIELD_ESTABLISHMENT): the
    // lot germinates at least about 80%, so its figure is not below the count's.
    expect(projectModel(emergence, 0.5).percent).toBeGreaterThanOrEqual(
      projectModel(counted, 0.5).percent - 2,
    );
    expect(width(emergence, 0.5)).toBeGreaterThan(width(counted, 0.5));
    expect(width(emergence, 0.5)).toBeLessThan(width(none, 0.5));
  });

  it('when a counted test and a rough score disagree, then only counted tests are compared for holding back', () => {
    const m = fitOne([
      assay('early', 0.2, 30, 100),
      { id: 'late', age: 1.5, alive: 0, sown: 100, evidence: { kind: 'score', score: 'most' } },
    ]);
    expect(m.heldBack).toEqual([]);
  });

  it('when a weak piece of evidence cannot be read, then that lot says so', () => {
    const [r] = fitSpeciesModel(
      [
        {
          id: 'bad',
          assays: [{ id: 'x', age: 1, alive: 0, sown: 0, evidence: { kind: 'score', score: 'few' } }],
        },
      ],
      TOMATO,
    );
    expect(r).toMatchObject({ ok: false, lotId: 'bad' });
  });
});
