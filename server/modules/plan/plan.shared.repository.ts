// What other modules may read of the plan: every entry of a bank with its dates now (live while
// unsown), for the overview and reminders; what came up from the bank's sowings, for the viability
// fits; and, inside the bank settings' transaction, the record of what a moved frost date did.
// Cross-module reads go through a module's service or its *.shared.repository.ts, never its plain
// repository (tests/unit/layering.test.ts).
import type { DbOrTx } from '#server/db/database';
import { liveEntries } from './plan-live';

export { emergenceOfSpecies, type EmergenceRow } from './plan.repository';
export { recordFrostMove } from './plan-live';

/** Every entry of the bank with its species, lot and dates now, for the overview. */
export const listForOverview = (db: DbOrTx, bankId: string) => liveEntries(db, bankId);

/** The bank's unsown entries with their dates now, for sowing reminders. */
export const unsownEntries = (db: DbOrTx, bankId: string) => liveEntries(db, bankId, 'unsown');

// Generations: the plants module reads a sown entry to record the plants it grew.
export { findEntry as findPlanEntry } from './plan.repository';
