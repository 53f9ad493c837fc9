// Room under the lights: how long the reference species stay in the seed tray and how much bench
// they take once potted up, and the one unit every growing space is counted in. Kept beside
// species-reference.ts (same Source records, same honesty about where a value comes from) so the
// species table itself stays as it is; reference-sync.ts merges these into each species' traits.
import type { Source } from './species-reference';

/**
 * Hilum counts indoor growing room in cells: one cell of a 72-cell insert in a standard 10 × 20 inch
 * (1020) flat. A tray is that whole flat, so a tray is 72 cells (source `cellTray72`).
 */
export const CELLS_PER_TRAY = 72;

export const SPACE_SOURCES = {
  cellTray72: {
    title: 'Plug-flat table of a greenhouse supplier: 72 square cells per sheet (6 × 12) in a 1020-size flat',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Read in a supplier’s catalogue table; a 1020 flat is about 10 × 20 inches (200 square inches).',
  },
  flatCounts: {
    title: 'How many plants are in a flat: a 1020 flat holds 18 pots (an “1801”), or six 6-packs (36 plants)',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Read on a horticulture explainer page. Cells per plant = 72 ÷ plants per flat: 72 ÷ 18 = 4 for a pot, 72 ÷ 36 = 2 for a 6-pack cell [computed].',
  },
  tomatoPotUp: {
    title:
      'Tomato seedlings are moved to their own pots at the first true leaves, about 2–3 weeks after sowing',
    publisher: null,
    year: null,
    basis: 'read',
    note: 'Read on a gardening question-and-answer page (secondary). Hilum takes the upper end, 3 weeks.',
  },
  vinesInPots: {
    title:
      'Time to Start Seeds? (vine crops are sown straight into peat pots; their roots dislike disturbance)',
    publisher: 'Penn State Extension',
    year: 2012,
    basis: 'read',
    note: 'Cucumber, melons and squash: sown in the pot they are planted out in, so never potted up (0 weeks).',
  },
  potUpPractice: {
    title: 'Prick out or pot up at the first true leaves, about 3 weeks after sowing, common garden practice',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'From memory; the week varies with warmth and light.',
  },
  potUpSlowMemory: {
    title:
      'Slow, tiny seedlings (petunia, snapdragon, pansy) and peppers are potted up later, about 4–5 weeks after sowing',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory; confirm against an extension guide before relying on it.',
  },
  trayGrownMemory: {
    title: 'Onions and leeks are grown on in their sowing tray or module until planting out',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory: never potted up, so counted as sown in the cell they grow on in (0 weeks), one cell a plant.',
  },
  rootTrainerMemory: {
    title: 'Sweet peas are sown straight into deep cells (root trainers) and not potted up',
    publisher: null,
    year: null,
    basis: 'memory',
    note: 'From memory; a deep cell is counted as a 6-pack cell (2 cells of bench).',
  },
  spaceDefault: {
    title:
      'Hilum’s assumption where a species has no value: potted up after 3 weeks into a 6-pack cell (2 cells)',
    publisher: null,
    year: null,
    basis: 'common-practice',
    note: 'The common-practice week of `potUpPractice` and the 6-pack of `flatCounts`; set the species’ own values for a better answer.',
  },
} as const satisfies Record<string, Source>;
export type SpaceSourceKey = keyof typeof SPACE_SOURCES;

/** The two traits of room under the lights, as a species carries them. */
export interface SpaceTraits {
  /** Weeks from sowing to potting up; 0 = sown straight into the pot or cell it grows on in. */
  potUpWeeks: number | null;
  /** Cells of bench one plant takes once potted up. */
  cellsPerPlant: number | null;
}
export type SpaceTraitName = keyof SpaceTraits;

interface SpaceRecord extends SpaceTraits {
  sources: Record<SpaceTraitName, SpaceSourceKey>;
}

/** The values Hilum assumes for a species with none (source `spaceDefault`). */
export const DEFAULT_SPACE: { [K in SpaceTraitName]: number } = { potUpWeeks: 3, cellsPerPlant: 2 };

const POT = 4; // 72 ÷ 18 pots per flat (flatCounts) [computed]
const PACK_CELL = 2; // 72 ÷ 36 six-pack cells per flat (flatCounts) [computed]

/** Weeks to potting up from its own source; cells per plant from the flat counts. */
const record = (potUpWeeks: number, cellsPerPlant: number, potUpSource: SpaceSourceKey): SpaceRecord => ({
  potUpWeeks,
  cellsPerPlant,
  sources: { potUpWeeks: potUpSource, cellsPerPlant: 'flatCounts' },
});

/** Both values from one source. */
const own = (potUpWeeks: number, cellsPerPlant: number, source: SpaceSourceKey): SpaceRecord => ({
  potUpWeeks,
  cellsPerPlant,
  sources: { potUpWeeks: source, cellsPerPlant: source },
});

/** By reference species key (shared/species-reference.ts); species not listed take DEFAULT_SPACE. */
export const SPECIES_SPACE: Readonly<Record<string, SpaceRecord>> = {
  tomato: record(3, POT, 'tomatoPotUp'),
  pepper: record(4, POT, 'potUpSlowMemory'),
  eggplant: record(4, POT, 'potUpSlowMemory'),
  cucumber: record(0, POT, 'vinesInPots'),
  squash: record(0, POT, 'vinesInPots'),
  lettuce: record(3, PACK_CELL, 'potUpPractice'),
  cabbage: record(3, PACK_CELL, 'potUpPractice'),
  broccoli: record(3, PACK_CELL, 'potUpPractice'),
  kale: record(3, PACK_CELL, 'potUpPractice'),
  onion: own(0, 1, 'trayGrownMemory'),
  leek: own(0, 1, 'trayGrownMemory'),
  basil: record(3, PACK_CELL, 'potUpPractice'),
  parsley: record(4, PACK_CELL, 'potUpSlowMemory'),
  petunia: record(5, PACK_CELL, 'potUpSlowMemory'),
  snapdragon: record(5, PACK_CELL, 'potUpSlowMemory'),
  viola: record(5, PACK_CELL, 'potUpSlowMemory'),
  marigold: record(3, PACK_CELL, 'potUpPractice'),
  zinnia: record(3, PACK_CELL, 'potUpPractice'),
  cosmos: record(3, PACK_CELL, 'potUpPractice'),
  calendula: record(3, PACK_CELL, 'potUpPractice'),
  aster: record(3, PACK_CELL, 'potUpPractice'),
  'sweet-pea': own(0, PACK_CELL, 'rootTrainerMemory'),
};

/** A reference species' space traits (null where it has none: the plan then assumes DEFAULT_SPACE). */
export function spaceTraitsOf(key: string): SpaceTraits {
  const r = SPECIES_SPACE[key];
  return { potUpWeeks: r?.potUpWeeks ?? null, cellsPerPlant: r?.cellsPerPlant ?? null };
}

/** A source as a species' `sources` entry names it: "title, publisher (year)" and its basis. */
export function sourceRef(s: Source): { title: string; basis: string } {
  const publisher = s.publisher ? `, ${s.publisher}` : '';
  const year = s.year ? ` (${s.year})` : '';
  return { title: `${s.title}${publisher}${year}`, basis: s.basis };
}

/** Where each space trait of a reference species comes from, in the species' `sources` form. */
export function spaceSourcesOf(key: string): Record<SpaceTraitName, { title: string; basis: string }> {
  const r = SPECIES_SPACE[key];
  const of = (k: SpaceSourceKey) => sourceRef(SPACE_SOURCES[k]);
  return {
    potUpWeeks: of(r?.sources.potUpWeeks ?? 'spaceDefault'),
    cellsPerPlant: of(r?.sources.cellsPerPlant ?? 'spaceDefault'),
  };
}
