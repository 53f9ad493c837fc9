// What other modules may read of the reminders repository: the bank's running germination tests,
// whose check days the calendar feed shows as the reminders announce them. Cross-module reads go
// through a module's service or its *.shared.repository.ts (tests/unit/layering.test.ts).
export { runningAssays } from './reminders.repository';
