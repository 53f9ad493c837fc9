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

/**
 * The latest calendar date that is "today" somewhere (UTC+14). A date after it is in the future
 * for every grower, whatever the bank's time zone; one on or before it may be today for them.
 */
export function latestToday(clock: Clock): string {
  return new Date(clock.now().getTime() + 14 * 3_600_000).toISOString().slice(0, 10);
}
