import { assertCount, assertFinite } from './validate';

/** One count of a test: days since sowing and the cumulative number of seeds germinated so far. */
export interface GerminationCheck {
  day: number;
  cumulative: number;
}

/**
 * Measures of germination time and evenness (as listed by Ranal & Santana 2006, Revista Brasil.
 * Bot. 29:1–11), with nᵢ the new germinants found at day tᵢ and N = Σnᵢ. The formulas date every
 * seedling to the check that found it, so they only say something about timing when the checks
 * pin the seedlings down. Null where a measure is undefined or the checks cannot support it:
 *
 * - Nothing germinated (N = 0): every measure but the count and the speed index (0) is null.
 * - Time measures (mean time, rate, coefficient of velocity, speed index) need seedlings found on
 *   at least two check days, or a count of zero on a day after sowing before the one day they were
 *   found (then the interval they came up in is known). With only a final count, or everything
 *   already up at the first count, all that is known is that they were up by then.
 * - Spread measures (variance, uncertainty, synchrony) need seedlings found on at least two check
 *   days: when all were found on one day, U = 0 and Z = 1 describe the check schedule, not the
 *   seeds. Variance and synchrony also need N ≥ 2.
 * - T50 interpolates between two real checks around the half-way count. When half were already up
 *   at the first check with seedlings and no zero count came before it, the interpolation would run
 *   from sowing day — an assumption, not a count — and T50 is null.
 *
 * timingNote says in words which of these applies.
 */
export interface GerminationTiming {
  /** N, the final cumulative count. */
  germinated: number;
  /** Mean germination time, Σnᵢtᵢ / N (days). */
  meanDays: number | null;
  /** Σnᵢ(tᵢ − MGT)² / (N − 1) (days²). */
  variance: number | null;
  /** Mean germination rate, 1 / MGT (per day). */
  rate: number | null;
  /** Coefficient of velocity, 100·N / Σnᵢtᵢ. */
  coefficientOfVelocity: number | null;
  /** Time to 50% of final germination, interpolated at N/2 (Farooq et al. 2005). */
  t50Days: number | null;
  /** Time to 50% of final germination, interpolated at (N + 1)/2 (Coolbear et al. 1984). */
  t50DaysCoolbear: number | null;
  /** Speed index Σ nᵢ/tᵢ (0 when nothing germinated). */
  speedIndex: number | null;
  /** Uncertainty U = −Σ fᵢ log₂ fᵢ, fᵢ = nᵢ/N (bits). */
  uncertaintyBits: number | null;
  /** Synchrony Z = Σ C(nᵢ, 2) / C(N, 2). */
  synchrony: number | null;
}

interface Step {
  day: number;
  cumulative: number;
  fresh: number;
}

/** Sorts by day and checks that days are distinct and counts never fall. */
function toSteps(checks: readonly GerminationCheck[]): Step[] {
  const sorted = [...checks].sort((a, b) => a.day - b.day);
  const steps: Step[] = [];
  let previousDay = Number.NEGATIVE_INFINITY;
  let previous = 0;
  for (const { day, cumulative } of sorted) {
    assertFinite(day, 'day');
    if (day < 0) throw new RangeError(`day must be ≥ 0 (got ${String(day)})`);
    assertCount(cumulative, 'cumulative');
    if (day === previousDay) throw new RangeError(`day ${String(day)} appears more than once`);
    if (cumulative < previous) {
      throw new RangeError(
        `cumulative count on day ${String(day)} (${String(cumulative)}) is below the earlier count (${String(previous)})`,
      );
    }
    if (day === 0 && cumulative > 0)
      throw new RangeError('seeds cannot have germinated on the day of sowing (day 0)');
    steps.push({ day, cumulative, fresh: cumulative - previous });
    previousDay = day;
    previous = cumulative;
  }
  return steps;
}

/**
 * Linear interpolation of the day the cumulative count reaches `target`:
 * T = tᵢ + (X − Nᵢ)(tⱼ − tᵢ)/(Nⱼ − Nᵢ) for the checks with Nᵢ < X ≤ Nⱼ (Coolbear et al. 1984).
 * Null when the count never reaches X, or when Nᵢ would be the count of 0 assumed on sowing day
 * rather than a real check after sowing: the seedlings' lag after sowing makes that a guess.
 */
function timeToCount(steps: readonly Step[], target: number): number | null {
  let beforeDay = 0;
  let beforeCount = 0;
  let beforeIsCheck = false;
  for (const step of steps) {
    if (step.cumulative >= target && step.cumulative > beforeCount) {
      if (!beforeIsCheck) return null;
      return beforeDay + ((target - beforeCount) * (step.day - beforeDay)) / (step.cumulative - beforeCount);
    }
    beforeDay = step.day;
    beforeCount = step.cumulative;
    beforeIsCheck = step.day > 0;
  }
  return null;
}

/** What the checks can support: see GerminationTiming. */
interface Support {
  total: number;
  /** Check days that found new seedlings. */
  seedlingDays: number[];
  /** The last check after sowing that found no seedlings yet, if any. */
  lastZeroDay: number | null;
  /** Time measures are supported. */
  time: boolean;
  /** Spread measures are supported. */
  spread: boolean;
}

function support(steps: readonly Step[]): Support {
  const seedlingDays = steps.filter((s) => s.fresh > 0).map((s) => s.day);
  const zeros = steps.filter((s) => s.day > 0 && s.cumulative === 0);
  const lastZeroDay = zeros.length > 0 ? (zeros[zeros.length - 1]?.day ?? null) : null;
  return {
    total: steps.length === 0 ? 0 : (steps[steps.length - 1]?.cumulative ?? 0),
    seedlingDays,
    lastZeroDay,
    time: seedlingDays.length >= 2 || (seedlingDays.length === 1 && lastZeroDay !== null),
    spread: seedlingDays.length >= 2,
  };
}

function pairs(n: number): number {
  return (n * (n - 1)) / 2;
}

export function germinationTiming(checks: readonly GerminationCheck[]): GerminationTiming {
  const steps = toSteps(checks);
  const { total, time, spread } = support(steps);
  if (total === 0) {
    return {
      germinated: 0,
      meanDays: null,
      variance: null,
      rate: null,
      coefficientOfVelocity: null,
      t50Days: null,
      t50DaysCoolbear: null,
      speedIndex: 0,
      uncertaintyBits: null,
      synchrony: null,
    };
  }
  const fresh = steps.filter((s) => s.fresh > 0);
  const speedIndex = fresh.reduce((sum, s) => sum + s.fresh / s.day, 0);
  const weightedDays = fresh.reduce((sum, s) => sum + s.fresh * s.day, 0);
  const meanDays = weightedDays / total;
  const squares = fresh.reduce((sum, s) => sum + s.fresh * (s.day - meanDays) ** 2, 0);
  // −Σ f log₂ f over the check days with seedlings.
  const uncertainty = fresh.reduce((sum, s) => {
    const f = s.fresh / total;
    return sum - f * Math.log2(f);
  }, 0);
  return {
    germinated: total,
    meanDays: time ? meanDays : null,
    variance: spread && total >= 2 ? squares / (total - 1) : null,
    rate: time ? 1 / meanDays : null,
    coefficientOfVelocity: time ? (100 * total) / weightedDays : null,
    t50Days: timeToCount(steps, total / 2),
    t50DaysCoolbear: timeToCount(steps, (total + 1) / 2),
    speedIndex: time ? speedIndex : null,
    uncertaintyBits: spread ? uncertainty : null,
    synchrony: spread && total >= 2 ? fresh.reduce((sum, s) => sum + pairs(s.fresh), 0) / pairs(total) : null,
  };
}

const dayWords = (day: number) => `day ${String(Math.round(day * 10) / 10)}`;

/**
 * Why some timing figures of these checks are null, in a grower's words; null when every figure
 * the seedlings allow is given (or there are no checks at all).
 */
export function timingNote(checks: readonly GerminationCheck[]): string | null {
  const steps = toSteps(checks);
  if (steps.length === 0) return null;
  const { total, seedlingDays, lastZeroDay, time, spread } = support(steps);
  const first = seedlingDays[0];
  if (total === 0 || first === undefined) return 'No seedlings yet, so there is nothing to time.';
  if (!time) {
    return (
      `Every seedling was first seen at the count on ${dayWords(first)}, so the days they came up on are not known, ` +
      `only that they were up by then. To see how fast and how evenly they come up, count every day or two ` +
      `from when the first seedlings are due.`
    );
  }
  if (!spread) {
    return (
      `Every seedling came up between the counts on ${dayWords(lastZeroDay ?? 0)} and ${dayWords(first)}, ` +
      `so how evenly they came up is not known. Counting more often shows it.`
    );
  }
  if (timeToCount(steps, total / 2) === null) {
    return (
      `Half of the seedlings were already up at the first count that found any (${dayWords(first)}), so the day ` +
      `half had come up is not known, only that it was by then. A count before the first seedlings appear pins it down.`
    );
  }
  return null;
}
