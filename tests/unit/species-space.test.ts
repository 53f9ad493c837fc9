import { describe, expect, it } from 'vitest';
import { SPECIES_REFERENCE, sourceSchema } from '#shared/species-reference';
import { CELLS_PER_TRAY, SPACE_SOURCES, SPECIES_SPACE } from '#shared/species-space';
import { referenceSources, referenceTraits } from '#server/modules/species/reference-sync';

describe('the reference species’ room under the lights', () => {
  it('when listed, then every key is a reference species, and every species started indoors has values', () => {
    const keys = new Set(SPECIES_REFERENCE.map((s) => s.key));
    for (const key of Object.keys(SPECIES_SPACE)) expect(keys, key).toContain(key);
    const indoor = SPECIES_REFERENCE.filter((s) => s.startMethod !== 'direct').map((s) => s.key);
    expect(indoor.filter((k) => !SPECIES_SPACE[k])).toEqual([]);
  });

  it('when its sources are read, then each is a well-formed source and says how it is known', () => {
    for (const s of Object.values(SPACE_SOURCES)) expect(sourceSchema.safeParse(s).success).toBe(true);
    // A 72-cell insert per 1020 flat [read]; a pot is 72 ÷ 18 = 4 cells and a 6-pack cell 72 ÷ 36 = 2 [computed].
    expect(CELLS_PER_TRAY).toBe(72);
    expect(SPECIES_SPACE.tomato).toMatchObject({ potUpWeeks: 3, cellsPerPlant: CELLS_PER_TRAY / 18 });
    expect(SPECIES_SPACE.marigold).toMatchObject({ cellsPerPlant: CELLS_PER_TRAY / 36 });
  });

  it('when synced, then a species carries the two traits and their sources, memory marked as memory', () => {
    const pepper = SPECIES_REFERENCE.find((s) => s.key === 'pepper')!;
    expect(referenceTraits(pepper)).toMatchObject({ potUpWeeks: 4, cellsPerPlant: 4 });
    const sources = referenceSources(pepper);
    expect(sources.potUpWeeks?.basis).toBe('memory');
    expect(sources.cellsPerPlant?.basis).toBe('read');
    const carrot = SPECIES_REFERENCE.find((s) => s.key === 'carrot')!;
    expect(referenceTraits(carrot)).toMatchObject({ potUpWeeks: null, cellsPerPlant: null });
    expect(referenceSources(carrot).potUpWeeks?.basis).toBe('common-practice');
  });
});
