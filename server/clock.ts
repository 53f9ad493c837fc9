/** The app's only source of "now", so tests can move time. */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };

/** A clock for tests: starts at `start` and moves only when told. */
export function createTestClock(start: Date | string): Clock & { set(at: Date | string): void; advanceDays(days: number): void } {
  let current = new Date(start);
  return {
    now: () => new Date(current),
    set(at) {
      current = new Date(at);
    },
    advanceDays(days) {
      current = new Date(current.getTime() + days * 86_400_000);
    },
  };
}
