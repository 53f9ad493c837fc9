// What other modules may call of the lots repository, inside their own transactions: moving stock
// (sowings, germination tests), reading lots as lists, labels and viability fits read them, and a
// lot's seed weight to turn grams into seeds (seedWeightSourcesForLot). Cross-
// module reads and writes go through a module's service or its *.shared.repository.ts, never its
// plain repository (tests/unit/layering.test.ts).
export {
  insertMovement,
  lockLot,
  lotsForDecisions,
  lotsQuery,
  seedWeightSourcesForLot,
  stockOf,
  toLotDto,
  updateLot,
  type DecisionLot,
} from './lots.repository';

// Generations: the plants module checks a plant's lot is of the bank and makes no cycle.
export { findBankLot, lockLineage, lotsOfParents, makesCycle } from './lineage.repository';
export { lineageCycle } from './lot-lineage';
