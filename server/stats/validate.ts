// Argument checks shared by the statistics functions. Each throws a RangeError whose message names
// the argument, so a caller (or an API error handler) can pass the message on as it is.

export function assertFinite(value: number, name: string): void {
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be a finite number (got ${String(value)})`);
}

export function assertCount(value: number, name: string): void {
  if (!Number.isInteger(value) || value < 0) {
    throw new RangeError(`${name} must be a whole number ≥ 0 (got ${String(value)})`);
  }
}

export function assertPositiveCount(value: number, name: string): void {
  if (!Number.isInteger(value) || value < 1) {
    throw new RangeError(`${name} must be a whole number ≥ 1 (got ${String(value)})`);
  }
}

export function assertSuccesses(successes: number, trials: number, what = 'successes'): void {
  assertCount(successes, what);
  assertCount(trials, 'trials');
  if (successes > trials) {
    throw new RangeError(`${what} (${String(successes)}) cannot exceed trials (${String(trials)})`);
  }
}

/** A probability strictly between 0 and 1, such as a confidence level or an assurance. */
export function assertOpenUnit(value: number, name: string): void {
  if (!Number.isFinite(value) || value <= 0 || value >= 1) {
    throw new RangeError(`${name} must be strictly between 0 and 1 (got ${String(value)})`);
  }
}

export function assertPercent(value: number, name: string): void {
  if (!Number.isFinite(value) || value < 0 || value > 100) {
    throw new RangeError(`${name} must be a percentage from 0 to 100 (got ${String(value)})`);
  }
}
