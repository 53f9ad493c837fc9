import { describe, expect, it } from 'vitest';
import { EMPTY_TRAITS } from '#shared/schemas/species';
import { seedSavingTraitsOf } from '#shared/species-seed-saving';
import { isolationWarnings, populationWarning, type KeptPlant } from '#server/modules/plants/keeping-true';

// Spinach: wind-pollinated, 2 miles (3218.688 m) apart, 50 plants (garden Seed Saving Chart [read];
// 1 mile = 1609.344 m by definition).
const spinach = { commonName: 'Spinach', traits: { ...EMPTY_TRAITS, ...seedSavingTraitsOf('spinach') } };
const plant = (id: string, variety: string | null, extra: Partial<KeptPlant> = {}): KeptPlant => ({
  id,
  speciesId: 'sp',
  label: `Plant ${id}`,
  variety,
  season: 2026,
  isolation: null,
  ...extra,
});

describe('keeping-true warnings', () => {
  it('when seed was saved from 49 or 50 spinach plants, then 49 warns naming both numbers and 50 does not', () => {
    expect(populationWarning(spinach, 49)?.message).toMatch(
      /from 49 plants: Spinach needs at least 50 plants/,
    );
    expect(populationWarning(spinach, 50)).toBeNull();
    expect(populationWarning(spinach, null)).toBeNull();
  });

  it('when two spinach varieties give distances, then the larger counts, against 3,219 m', () => {
    const a = plant('a', 'Round Leaf', { isolation: { method: 'distance', meters: 500 } });
    const b = plant('b', 'Arrow Leaf', { isolation: { method: 'distance', meters: 3000 } });
    const [w] = isolationWarnings(a, [a, b], spinach);
    expect(w?.message).toMatch(
      /only 3,000 m apart: Spinach is pollinated by the wind and needs about 3,219 m/,
    );
    const far = { ...b, isolation: { method: 'distance' as const, meters: 3300 } };
    expect(isolationWarnings(a, [a, far], spinach)).toEqual([]);
  });

  it('when the same variety (any case or spacing), another season or another species grew nearby, then nothing warns', () => {
    const a = plant('a', 'Round Leaf');
    const others = [
      plant('b', '  round leaf '),
      plant('c', 'Arrow Leaf', { season: 2025 }),
      plant('d', 'Arrow Leaf', { speciesId: 'other' }),
    ];
    expect(isolationWarnings(a, [a, ...others], spinach)).toEqual([]);
    // A plant with no season is never compared.
    expect(isolationWarnings({ ...a, season: null }, [a, plant('e', 'Arrow Leaf')], spinach)).toEqual([]);
  });

  it('when a self-pollinated species or an unknown pollination is asked, then no isolation warning', () => {
    const tomato = { commonName: 'Tomato', traits: { ...EMPTY_TRAITS, ...seedSavingTraitsOf('tomato') } };
    const unknown = { commonName: 'Petunia', traits: { ...EMPTY_TRAITS, ...seedSavingTraitsOf('petunia') } };
    const a = plant('a', 'One');
    for (const sp of [tomato, unknown]) expect(isolationWarnings(a, [a, plant('b', 'Two')], sp)).toEqual([]);
  });
});
