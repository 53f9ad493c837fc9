// What other modules may use of the plants module: the seed-saving caution for seed saved from an
// F1 hybrid, which a lot's line repeats when one of its parent plants was one (lots' lineage).
// Cross-module reads go through a module's service or its *.shared.repository.ts (tests/unit/layering).
export { HYBRID_CAUTION } from './plant-cautions';
