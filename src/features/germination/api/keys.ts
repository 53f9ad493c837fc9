import type { IntervalMethod } from './interval';

/*
 * Query keys of germination tests. Everything sits under the bank's ['banks', bankId] prefix (the
 * banks feature's convention), and a lot's test list under that lot's detail key
 * ['banks', bankId, 'lots', 'detail', lotId] (the lots feature's layout, written out here because
 * features do not import each other), so refreshing a bank or a lot refreshes its tests too.
 */
export const germinationKeys = {
  bank: (bankId: string) => ['banks', bankId] as const,
  tests: (bankId: string) => [...germinationKeys.bank(bankId), 'tests'] as const,
  test: (bankId: string, testId: string) => [...germinationKeys.tests(bankId), testId] as const,
  testDetail: (bankId: string, testId: string, interval: IntervalMethod) =>
    [...germinationKeys.test(bankId, testId), { interval }] as const,
  lots: (bankId: string) => [...germinationKeys.bank(bankId), 'lots'] as const,
  lot: (bankId: string, lotId: string) => [...germinationKeys.lots(bankId), 'detail', lotId] as const,
  lotTests: (bankId: string, lotId: string) => [...germinationKeys.lot(bankId, lotId), 'tests'] as const,
};

const bankPath = (bankId: string) => `/api/banks/${encodeURIComponent(bankId)}`;
const testPath = (bankId: string, testId: string) => `${bankPath(bankId)}/tests/${encodeURIComponent(testId)}`;

export const apiPaths = {
  testsCsv: (bankId: string) => `${bankPath(bankId)}/tests.csv`,
  testsImport: (bankId: string, dryRun: boolean) => `${bankPath(bankId)}/tests/import${dryRun ? '?dryRun=true' : ''}`,
  lotTests: (bankId: string, lotId: string) => `${bankPath(bankId)}/lots/${encodeURIComponent(lotId)}/tests`,
  test: testPath,
  counts: (bankId: string, testId: string) => `${testPath(bankId, testId)}/counts`,
  countsOn: (bankId: string, testId: string, date: string) =>
    `${testPath(bankId, testId)}/counts/${encodeURIComponent(date)}`,
  finish: (bankId: string, testId: string) => `${testPath(bankId, testId)}/finish`,
  reopen: (bankId: string, testId: string) => `${testPath(bankId, testId)}/reopen`,
  tray: (bankId: string, testId: string, trayId: string) => `${testPath(bankId, testId)}/trays/${encodeURIComponent(trayId)}`,
};
