import { describe, expect, it } from 'vitest';
import {
  SOURCES,
  SPECIES_REFERENCE,
  TRAIT_KEYS,
  fahrenheitToCelsius,
  seedsPerOunceToPerGram,
  speciesReferenceSchema,
  speciesTraitValue,
  type SourceKey,
  type SpeciesReference,
} from '#shared/species-reference';

function species(key: string): SpeciesReference {
  const found = SPECIES_REFERENCE.find((s) => s.key === key);
  if (!found) throw new Error(`no species ${key}`);
  return found;
}

const ABSENT_BASES = new Set(['unknown', 'not-published']);

describe('species reference set: shape', () => {
  it.each(SPECIES_REFERENCE.map((s) => [s.key, s] as const))(
    'when the %s record is parsed with the schema, then it is valid and unchanged',
    (_key, record) => {
      const parsed = speciesReferenceSchema.safeParse(record);
      expect(parsed.error?.issues ?? []).toEqual([]);
      expect(parsed.data).toEqual(record);
    },
  );

  it('when the keys are counted, then there are at least 30 and none repeats', () => {
    const keys = SPECIES_REFERENCE.map((s) => s.key);
    expect(new Set(keys).size).toBe(keys.length);
    expect(keys.length).toBeGreaterThanOrEqual(30);
  });

  it('when the set is searched for the species the app must ship, then every one is there', () => {
    const required = [
      'tomato',
      'pepper',
      'eggplant',
      'lettuce',
      'onion',
      'leek',
      'cabbage',
      'broccoli',
      'kale',
      'carrot',
      'beet',
      'spinach',
      'pea',
      'bean',
      'cucumber',
      'squash',
      'basil',
      'parsley',
      'petunia',
      'snapdragon',
      'marigold',
      'zinnia',
      'cosmos',
      'calendula',
      'sweet-pea',
      'nasturtium',
      'viola',
      'aster',
      'sunflower',
      'poppy',
    ];
    const keys = new Set(SPECIES_REFERENCE.map((s) => s.key));
    expect(required.filter((k) => !keys.has(k))).toEqual([]);
  });

  it('when scientific names are compared, then no two records claim the same name', () => {
    const names = SPECIES_REFERENCE.map((s) => s.scientificName);
    expect(new Set(names).size).toBe(names.length);
  });
});

describe('species reference set: sources', () => {
  it('when every trait of every record is checked, then a value has a real source and a gap says it is a gap', () => {
    const problems: string[] = [];
    for (const s of SPECIES_REFERENCE) {
      for (const trait of TRAIT_KEYS) {
        const key: SourceKey = s.sources[trait];
        const source = SOURCES[key];
        if (!source) {
          problems.push(`${s.key}.${trait}: no SOURCES entry ${key}`);
          continue;
        }
        const value = speciesTraitValue(s, trait);
        if (value !== null && ABSENT_BASES.has(source.basis)) {
          problems.push(`${s.key}.${trait}: has a value but its source says there is none`);
        }
        if (value === null && !ABSENT_BASES.has(source.basis)) {
          problems.push(`${s.key}.${trait}: is null but cites ${key} (${source.basis})`);
        }
      }
    }
    expect(problems).toEqual([]);
  });

  it('when a source is recalled from memory, then its citation says so in words', () => {
    for (const [key, source] of Object.entries(SOURCES)) {
      if (source.basis === 'memory' || source.basis === 'common-practice') {
        expect(source.note, key).toMatch(/from memory/i);
      }
    }
  });

  it('when a SOURCES entry is defined, then at least one record cites it', () => {
    const cited = new Set(SPECIES_REFERENCE.flatMap((s) => Object.values(s.sources)));
    expect(Object.keys(SOURCES).filter((k) => !cited.has(k as SourceKey))).toEqual([]);
  });

  it('when count days come from the project notes marked [memory], then they are cited as memory, not read', () => {
    // REFERENCES.md lists tomato 5/14, lettuce 4/7, pepper 7/14, onion 6/12, cucumber 4/8,
    // basil 4/14, petunia 7/14, marigold 4/14 as [memory — confirm against the seed-testing rules].
    const recalled: Record<string, [number, number]> = {
      tomato: [5, 14],
      lettuce: [4, 7],
      pepper: [7, 14],
      onion: [6, 12],
      cucumber: [4, 8],
      basil: [4, 14],
      petunia: [7, 14],
      marigold: [4, 14],
    };
    for (const [key, [first, final]] of Object.entries(recalled)) {
      const s = species(key);
      expect([s.firstCountDay, s.finalCountDay], key).toEqual([first, final]);
      expect(SOURCES[s.sources.firstCountDay].basis, key).toBe('memory');
      expect(SOURCES[s.sources.finalCountDay].basis, key).toBe('memory');
    }
  });
});

describe('species reference set: values read in published sources', () => {
  // Iowa State University, Horticulture & Home Pest News, "Seed Germination Guide" (2017) [read]:
  // light (L = needs light, C = cover, light cover), germination °F, weeks sowing to transplant.
  const isu2017: [string, SpeciesReference['lightToGerminate'], number, number, number, number][] = [
    ['petunia', 'light', 75, 80, 8, 10], // L, 75–80 °F, 8–10 weeks
    ['snapdragon', 'light', 70, 75, 8, 10], // L, 70–75 °F, 8–10 weeks
    ['marigold', 'cover', 70, 75, 6, 8], // C, 70–75 °F, 6–8 weeks
    ['zinnia', 'cover', 70, 75, 4, 6], // C, 70–75 °F, 4–6 weeks
    ['onion', 'light-cover', 70, 75, 8, 10], // light cover, 70–75 °F, 8–10 weeks
    ['pepper', 'cover', 70, 75, 6, 8], // C, 70–75 °F, 6–8 weeks
    ['tomato', 'cover', 70, 75, 5, 7], // C, 70–75 °F, 5–7 weeks
    ['basil', 'cover', 65, 70, 5, 6], // C, 65–70 °F, 5–6 weeks
    ['cucumber', 'cover', 75, 80, 3, 4], // C, 75–80 °F, 3–4 weeks
  ];
  it.each(isu2017)(
    'when %s is looked up, then light, °F and weeks to transplant match the ISU 2017 table',
    (key, light, minF, maxF, minWeeks, maxWeeks) => {
      const s = species(key);
      expect(s.lightToGerminate).toBe(light);
      expect(s.germTemp).toMatchObject({ sourceUnit: 'F', minF, maxF });
      expect(s.weeksSowingToTransplant).toEqual({ min: minWeeks, max: maxWeeks });
      expect(s.sources.germTemp).toBe('isu2017');
      expect(s.sources.lightToGerminate).toBe('isu2017');
      expect(s.sources.weeksSowingToTransplant).toBe('isu2017');
      expect(SOURCES.isu2017.basis).toBe('read');
    },
  );

  it('when a °F range is stored, then °C is (°F − 32) × 5/9 exactly', () => {
    // Conversion formula (definition of the scales); 70 °F = 21.1 °C, 75 °F = 23.9 °C.
    expect(fahrenheitToCelsius(32)).toBe(0);
    expect(fahrenheitToCelsius(212)).toBe(100);
    expect(fahrenheitToCelsius(70)).toBeCloseTo(21.111111, 6);
    const tomato = species('tomato').germTemp;
    expect(tomato?.minC).toBeCloseTo(21.111111, 6); // ISU 2017: tomato 70–75 °F
    expect(tomato?.maxC).toBeCloseTo(23.888889, 6);
    for (const s of SPECIES_REFERENCE) {
      const t = s.germTemp;
      if (t?.sourceUnit === 'F' && t.minF !== null && t.maxF !== null) {
        expect(t.minC, s.key).toBe(((t.minF - 32) * 5) / 9);
        expect(t.maxC, s.key).toBe(((t.maxF - 32) * 5) / 9);
      }
    }
  });

  it('when days to germinate at home are looked up, then they match ISU 2023', () => {
    // ISU, "Germination requirements" (2023) [read]: petunia 7–10 d at 75 °F, light;
    // snapdragon 7–14 d at 70 °F, light; zinnia 5–7 d at 70 °F, dark.
    expect(species('petunia').homeGermination).toMatchObject({
      daysMin: 7,
      daysMax: 10,
      atF: 75,
      light: 'light',
    });
    expect(species('snapdragon').homeGermination).toMatchObject({
      daysMin: 7,
      daysMax: 14,
      atF: 70,
      light: 'light',
    });
    expect(species('zinnia').homeGermination).toMatchObject({
      daysMin: 5,
      daysMax: 7,
      atF: 70,
      light: 'dark',
    });
    for (const key of ['petunia', 'snapdragon', 'zinnia'])
      expect(species(key).sources.homeGermination).toBe('isu2023');
  });

  it("when days to emergence by soil temperature are looked up, then they match Harrington & Minges via Knott's", () => {
    // Harrington & Minges 1954 via Knott's Handbook (1997) [read, secondary];
    // soil °F 32/41/50/59/68/77/86/95, NG (no germination) = null.
    const table: Record<string, (number | null)[]> = {
      lettuce: [49, 15, 7, 4, 3, 2, 3, null],
      tomato: [null, null, 43, 14, 8, 6, 6, 9],
      pepper: [null, null, null, 25, 13, 8, 8, 9],
      onion: [136, 31, 13, 7, 5, 4, 4, 13],
      cucumber: [null, null, null, 13, 6, 4, 3, 3],
    };
    for (const [key, days] of Object.entries(table)) {
      const rows = species(key).emergenceDaysBySoilTemp;
      expect(
        rows?.map((r) => r.soilF),
        key,
      ).toEqual([32, 41, 50, 59, 68, 77, 86, 95]);
      expect(
        rows?.map((r) => r.days),
        key,
      ).toEqual(days);
      expect(species(key).sources.emergenceDaysBySoilTemp).toBe('knottEmergence');
    }
  });

  it("when seed life is looked up, then it matches ISU Yard & Garden 1999 from Knott's", () => {
    // ISU Yard & Garden (1999) from Knott's Handbook [read]: lettuce 6, cucumber 5, tomato 4,
    // pepper 2, onion 1, parsley 1, sweet corn 2 years.
    const years: Record<string, number> = {
      lettuce: 6,
      cucumber: 5,
      tomato: 4,
      pepper: 2,
      onion: 1,
      parsley: 1,
      'sweet-corn': 2,
    };
    for (const [key, y] of Object.entries(years)) {
      expect(species(key).storageLifeYears, key).toBe(y);
      expect(species(key).sources.storageLifeYears, key).toBe('isuSeedLife');
    }
  });

  it('when minimum germination is looked up, then it matches 7 CFR 201.31 where read', () => {
    // 7 CFR 201.31 [read]: tomato 75, lettuce 80, pepper 55, onion 70, cucumber 80 (percent).
    const minimum: Record<string, number> = { tomato: 75, lettuce: 80, pepper: 55, onion: 70, cucumber: 80 };
    for (const [key, pct] of Object.entries(minimum)) {
      expect(species(key).minGerminationPercent, key).toBe(pct);
      expect(species(key).sources.minGerminationPercent, key).toBe('cfr20131');
    }
    // Every other 7 CFR value in the set is recalled, and cited as memory.
    for (const s of SPECIES_REFERENCE) {
      if (s.minGerminationPercent !== null && !(s.key in minimum)) {
        expect(s.sources.minGerminationPercent, s.key).toBe('cfr20131Memory');
      }
    }
  });

  it('when seeds per gram are looked up, then they match the charts quoted in the project notes', () => {
    // A seed company's chart reproduced by a retailer [read]: lettuce ≈ 880, tomato ≈ 390,
    // pepper ≈ 160, onion ≈ 280 seeds per gram.
    expect(species('lettuce').seedsPerGram.typical).toBe(880);
    expect(species('tomato').seedsPerGram.typical).toBe(390);
    expect(species('pepper').seedsPerGram.typical).toBe(160);
    expect(species('onion').seedsPerGram.typical).toBe(280);
    // A horticulture columnist [read]: tomato 280–420, petunia 8,800–10,600, marigold 265–350,
    // zinnia 70–210 seeds per gram.
    expect(species('tomato').seedsPerGram.range).toEqual({ low: 280, high: 420 });
    expect(species('petunia').seedsPerGram.range).toEqual({ low: 8800, high: 10600 });
    expect(species('marigold').seedsPerGram.range).toEqual({ low: 265, high: 350 });
    expect(species('zinnia').seedsPerGram.range).toEqual({ low: 70, high: 210 });
    // Wehner & Horton 1989, Cucurbit Genet. Coop. Rpt. 12:16–17 [read]: cucumber 32–46.
    expect(species('cucumber').seedsPerGram.range).toEqual({ low: 32, high: 46 });
    // Snapdragon ≈ 6,300–7,000 [memory], so its citation must be a memory one.
    expect(species('snapdragon').seedsPerGram.range).toEqual({ low: 6300, high: 7000 });
    expect(SOURCES[species('snapdragon').sources.seedsPerGramRange].basis).toBe('memory');
    expect(SOURCES[species('snapdragon').sources.seedsPerGramTypical].basis).toBe('memory');
  });

  it('when seeds per ounce are converted, then they are divided by 28.35', () => {
    // REFERENCES.md: seeds per gram = seeds per ounce ÷ 28.35; 11,000 per ounce ≈ 388 per gram.
    expect(seedsPerOunceToPerGram(28.35)).toBe(1);
    expect(seedsPerOunceToPerGram(11000)).toBeCloseTo(388.0071, 4);
  });
});

describe('species reference set: internal consistency', () => {
  it('when a test has both count days, then the final count comes after the first', () => {
    for (const s of SPECIES_REFERENCE) {
      if (s.firstCountDay !== null && s.finalCountDay !== null) {
        expect(s.finalCountDay, s.key).toBeGreaterThan(s.firstCountDay);
      }
    }
  });

  it('when a temperature range is stored, then min ≤ max', () => {
    for (const s of SPECIES_REFERENCE) {
      if (s.germTemp) expect(s.germTemp.minC, s.key).toBeLessThanOrEqual(s.germTemp.maxC);
    }
  });

  it('when an indoor window is stored, then from (earliest, weeks before frost) ≥ to', () => {
    for (const s of SPECIES_REFERENCE) {
      const w = s.indoorStartWeeksBeforeFrost;
      if (w) expect(w.from, s.key).toBeGreaterThanOrEqual(w.to);
    }
  });

  it('when a crop is sown direct, then it has no indoor window, and an indoor crop has one', () => {
    for (const s of SPECIES_REFERENCE) {
      expect(s.indoorStartWeeksBeforeFrost === null, s.key).toBe(s.startMethod === 'direct');
    }
  });

  it('when the usual direct-sown crops are looked up, then they are marked direct', () => {
    // Common practice: beans, peas, carrots, beets, spinach, sunflowers, poppies and nasturtiums
    // are sown where they grow.
    for (const key of ['bean', 'pea', 'carrot', 'beet', 'spinach', 'sunflower', 'poppy', 'nasturtium']) {
      expect(species(key).startMethod, key).toBe('direct');
    }
  });

  it('when a seeds-per-gram range and typical value are both stored, then the typical value lies inside', () => {
    for (const s of SPECIES_REFERENCE) {
      const { range, typical } = s.seedsPerGram;
      if (range && typical !== null) {
        expect(typical, s.key).toBeGreaterThanOrEqual(range.low);
        expect(typical, s.key).toBeLessThanOrEqual(range.high);
      }
    }
  });

  it('when a species is poisonous, then it carries a caution that defers to local advice', () => {
    for (const s of SPECIES_REFERENCE.filter((x) => x.poisonous)) {
      expect(s.caution, s.key).toMatch(/poison centre|doctor/);
    }
    // Common practice / from memory: sweet pea seeds (lathyrism), poppies and morning-glory seeds
    // are poisonous.
    for (const key of ['sweet-pea', 'poppy', 'morning-glory']) expect(species(key).poisonous, key).toBe(true);
  });
});

describe('species reference schema: rejects bad records', () => {
  const tomato = species('tomato');

  it('when the indoor window runs the wrong way, then the record is rejected', () => {
    const bad = { ...tomato, indoorStartWeeksBeforeFrost: { from: 6, to: 8 } };
    expect(speciesReferenceSchema.safeParse(bad).success).toBe(false);
  });

  it('when °C does not match the °F read, then the record is rejected', () => {
    const germTemp = { minC: 21, maxC: 24, sourceUnit: 'F', minF: 70, maxF: 75 };
    expect(speciesReferenceSchema.safeParse({ ...tomato, germTemp }).success).toBe(false);
  });

  it('when the final count is not after the first, then the record is rejected', () => {
    expect(speciesReferenceSchema.safeParse({ ...tomato, finalCountDay: 5 }).success).toBe(false);
  });

  it('when a trait has no source named, then the record is rejected', () => {
    const { germTemp: _dropped, ...sources } = tomato.sources;
    expect(speciesReferenceSchema.safeParse({ ...tomato, sources }).success).toBe(false);
  });

  it('when a source key is not in SOURCES, then the record is rejected', () => {
    const sources = { ...tomato.sources, germTemp: 'a-guess' };
    expect(speciesReferenceSchema.safeParse({ ...tomato, sources }).success).toBe(false);
  });

  it('when a direct-sown crop is given an indoor window, then the record is rejected', () => {
    const bad = { ...species('carrot'), indoorStartWeeksBeforeFrost: { from: 4, to: 2 } };
    expect(speciesReferenceSchema.safeParse(bad).success).toBe(false);
  });

  it('when a poisonous species has no caution, then the record is rejected', () => {
    expect(speciesReferenceSchema.safeParse({ ...species('sweet-pea'), caution: null }).success).toBe(false);
  });
});

describe('species reference set: hardiness', () => {
  it('when vegetables in the read hardiness table are looked up, then each is in its group with that source', () => {
    // Purdue Extension HO-203, after University of Illinois VC-14 (read through a page quoting
    // it): very hardy (Hilum: hardy) lettuce, kale, spinach, pea; frost tolerant (half-hardy) beet,
    // broccoli, cabbage, carrot, onion plants; tender snap bean, sweet corn, tomato; warm loving
    // (very tender) cucumber, eggplant, pepper, squash.
    const groups: Record<string, string[]> = {
      hardy: ['lettuce', 'kale', 'spinach', 'pea'],
      'half-hardy': ['beet', 'broccoli', 'cabbage', 'carrot', 'onion'],
      tender: ['bean', 'sweet-corn', 'tomato'],
      'very-tender': ['cucumber', 'eggplant', 'pepper', 'squash'],
    };
    for (const [group, keys] of Object.entries(groups)) {
      for (const key of keys) {
        expect(species(key).hardiness, key).toBe(group);
        expect(species(key).sources.hardiness, key).toBe('purdueHo203');
      }
    }
    expect(SOURCES.purdueHo203.basis).toBe('read');
  });

  it('when a species’ hardiness is not from the read table, then its source says memory', () => {
    for (const s of SPECIES_REFERENCE) {
      if (s.hardiness !== null && s.sources.hardiness !== 'purdueHo203') {
        expect(SOURCES[s.sources.hardiness].basis, s.key).toBe('memory');
      }
    }
  });
});
