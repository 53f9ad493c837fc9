// What other modules may read of the plan repository: every entry of a bank with its species and
// lot, for the overview; what came up from the bank's sowings, for the viability fits. Cross-module
// reads go through a module's service or its *.shared.repository.ts, never its plain repository
// (tests/unit/layering.test.ts).
export { emergenceOfSpecies, listForOverview, type EmergenceRow } from './plan.repository';
