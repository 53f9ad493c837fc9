// What other modules may call of the banks repository, inside their own transactions: the bank's
// name for mail and calendars, and adding a member when an invitation is accepted. Cross-module
// reads and writes go through a module's service or its *.shared.repository.ts, never its plain
// repository (tests/unit/layering.test.ts).
export { bankName, insertMembership } from './banks.repository';
