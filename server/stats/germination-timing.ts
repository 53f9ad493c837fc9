import { assertCount, assertFinite } from './validate';

/** One count of a test: days since sowing and the cumulative number of seeds germinated so far. */
export interface GerminationCheck {
  day: number;
  cumulative: number;
}

/**
 * Measures of germination time and evenness (as listed by Ranal & Santana 2006, Revista Brasil.
 * Bot. 29:1–11), with nᵢ the new germinants found at day tᵢ and N = Σnᵢ. Null where a measure is
 * undefined: everything but the count and the speed index needs N ≥ 1; variance and synchrony
 * need N ≥ 2.
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
  speedIndex: number;
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
 * T = tᵢ + (X − Nᵢ)(tⱼ − tᵢ)/(Nⱼ − Nᵢ) for the checks with Nᵢ < X ≤ Nⱼ. Before the first check the
 * count is taken as 0 on day 0 (sowing), so a first check already past X interpolates from sowing.
 */
function timeToCount(steps: readonly Step[], target: number): number | null {
  let beforeDay = 0;
  let beforeCount = 0;
  for (const step of steps) {
    if (step.cumulative >= target && step.cumulative > beforeCount) {
      return beforeDay + ((target - beforeCount) * (step.day - beforeDay)) / (step.cumulative - beforeCount);
    }
    beforeDay = step.day;
    beforeCount = step.cumulative;
  }
  return null;
}

function pairs(n: number): number {
  return (n * (n - 1)) / 2;
}

export function germinationTiming(checks: readonly GerminationCheck[]): GerminationTiming {
  const steps = toSteps(checks);
  const fresh = steps.filter((s) => s.fresh > 0);
  const total = steps.length === 0 ? 0 : (steps[steps.length - 1]?.cumulative ?? 0);
  const speedIndex = fresh.reduce((sum, s) => sum + s.fresh / s.day, 0);
  if (total === 0) {
    return {
      germinated: 0,
      meanDays: null,
      variance: null,
      rate: null,
      coefficientOfVelocity: null,
      t50Days: null,
      t50DaysCoolbear: null,
      speedIndex,
      uncertaintyBits: null,
      synchrony: null,
    };
  }
  const weightedDays = fresh.reduce((sum, s) => sum + s.fresh * s.day, 0);
  const meanDays = weightedDays / total;
  const squares = fresh.reduce((sum, s) => sum + s.fresh * (s.day - meanDays) ** 2, 0);
  // −Σ f log₂ f; a lone class gives exactly 0 (written as 0, not −0).
  const uncertainty = fresh.reduce((sum, s) => {
    const f = s.fresh / total;
    return sum - f * Math.log2(f);
  }, 0);
  return {
    germinated: total,
    meanDays,
    variance: total >= 2 ? squares / (total - 1) : null,
    rate: 1 / meanDays,
    coefficientOfVelocity: (100 * total) / weightedDays,
    t50Days: timeToCount(steps, total / 2),
    t50DaysCoolbear: timeToCount(steps, (total + 1) / 2),
    speedIndex,
    uncertaintyBits: uncertainty === 0 ? 0 : uncertainty,
    synchrony: total >= 2 ? fresh.reduce((sum, s) => sum + pairs(s.fresh), 0) / pairs(total) : null,
  };
}
