import { seedlingsAboveSown } from '#shared/count-rules';
import {
  ROUGH_SCORE_ORDER,
  ROUGH_SCORE_WORDS,
  type CountsBody,
  type RoughScore,
} from '#shared/schemas/germination';
import { dayInWords } from '#shared/day-words';

export interface CountProblem {
  /** The body path it is about, as in the error's `fields`: `trays.<index>.cumulative` or `.trayId`. */
  field: string;
  /** One sentence that names the tray, what is wrong and what would fit. */
  message: string;
}

interface Tray {
  id: string;
  position: number;
  /** Null for a tray sown by weight or by a guess: its seedlings have no counted bound. */
  seeds_sown: number | null;
}

interface SavedCount {
  tray_id: string;
  check_date: string;
  cumulative: number;
}

interface SavedScore {
  tray_id: string;
  check_date: string;
  score: RoughScore;
}

/** The rule one tray's rough score breaks against its other check dates, if any. */
function scoreProblem(
  tray: Tray,
  score: RoughScore,
  date: string,
  startDate: string,
  saved: SavedScore[],
  counted: boolean,
): string | null {
  const label = `Tray ${tray.position}`;
  if (counted) {
    return `${label} has counts on other check days: count it on this day too, or remove its counts before scoring it roughly.`;
  }
  if (date === startDate && score !== 'none') {
    return `${label}: seedlings scored on the day the test started (${dayInWords(startDate)}). Score on a later day, or give "none".`;
  }
  const rank = ROUGH_SCORE_ORDER.indexOf(score);
  const mine = saved.filter((c) => c.tray_id === tray.id);
  const before = mine.filter((c) => c.check_date < date).at(-1);
  const after = mine.find((c) => c.check_date > date);
  if (before && rank < ROUGH_SCORE_ORDER.indexOf(before.score)) {
    return `${label}: "${ROUGH_SCORE_WORDS[score]}" is fewer than the "${ROUGH_SCORE_WORDS[before.score]}" scored on ${dayInWords(before.check_date)}. Scores are of all the seedlings so far.`;
  }
  if (after && rank > ROUGH_SCORE_ORDER.indexOf(after.score)) {
    return `${label}: "${ROUGH_SCORE_WORDS[score]}" is more than the "${ROUGH_SCORE_WORDS[after.score]}" scored later, on ${dayInWords(after.check_date)}. Correct that later score first.`;
  }
  return null;
}

/** The rule one tray's cumulative count breaks against its seeds and its other check dates, if any. */
function trayProblem(
  tray: Tray,
  cumulative: number,
  date: string,
  startDate: string,
  saved: SavedCount[],
): string | null {
  const label = `Tray ${tray.position}`;
  const aboveSown =
    tray.seeds_sown === null ? null : seedlingsAboveSown(tray.position, cumulative, tray.seeds_sown);
  if (aboveSown) return aboveSown;
  // Day 0: nothing has had time to sprout, and the timing statistics cannot place it.
  if (date === startDate && cumulative > 0) {
    return `${label}: ${cumulative} seedlings on the day the test started (${dayInWords(startDate)}). Count on a later day, or give 0.`;
  }
  const mine = saved.filter((c) => c.tray_id === tray.id);
  const before = mine.filter((c) => c.check_date < date).at(-1);
  const after = mine.find((c) => c.check_date > date);
  if (before && cumulative < before.cumulative) {
    return `${label}: ${cumulative} is fewer than the ${before.cumulative} counted on ${dayInWords(before.check_date)}. Counts are cumulative: give the total seedlings so far, at least ${before.cumulative}.`;
  }
  if (after && cumulative > after.cumulative) {
    return `${label}: ${cumulative} is more than the ${after.cumulative} counted later, on ${dayInWords(after.check_date)}. Correct that later count first, or give at most ${after.cumulative}.`;
  }
  return null;
}

/**
 * Every tray of a counts body that cannot be saved, in the order sent: not a tray of the test,
 * listed twice, above its seeds sown, sprouted on the start date, out of cumulative order with its
 * counts or scores on other dates (`saved`, `savedScores`, sorted by date), or counted on some
 * days and scored roughly on others. Empty when the whole body may be saved.
 */
export function countProblems(
  body: CountsBody,
  startDate: string,
  trays: Tray[],
  saved: SavedCount[],
  savedScores: SavedScore[] = [],
): CountProblem[] {
  const byId = new Map(trays.map((tr) => [tr.id, tr]));
  const seen = new Set<string>();
  const problems: CountProblem[] = [];
  for (const [index, entry] of body.trays.entries()) {
    const tray = byId.get(entry.trayId);
    if (!tray) {
      problems.push({
        field: `trays.${index}.trayId`,
        message: `Entry ${index + 1} is not a tray of this test.`,
      });
      continue;
    }
    const field = `trays.${index}.${entry.score === undefined ? 'cumulative' : 'score'}`;
    if (seen.has(tray.id)) {
      problems.push({ field, message: `Tray ${tray.position} is listed twice.` });
      continue;
    }
    seen.add(tray.id);
    const counted = saved.some((c) => c.tray_id === tray.id);
    const scored = savedScores.some((c) => c.tray_id === tray.id);
    const message =
      entry.score !== undefined
        ? scoreProblem(tray, entry.score, body.date, startDate, savedScores, counted)
        : scored
          ? `Tray ${tray.position} was scored roughly on other check days: score it on this day too, or remove its scores before counting it.`
          : trayProblem(tray, entry.cumulative ?? 0, body.date, startDate, saved);
    if (message) problems.push({ field, message });
  }
  return problems;
}

/**
 * A tray that was never counted cannot be finished: its seedlings are unknown, so it would enter the
 * result as a guess. The grower records a count (0 when nothing came up) or sets the tray aside.
 */
export function uncountedAtFinish(position: number): string {
  return `Tray ${position} has no counts: record its seedlings on a check day (0 if none came up), or set it aside with a reason.`;
}

export interface FinishEntry {
  abnormal: number;
  ungerminated: number;
  fresh?: number | null | undefined;
  dead?: number | null | undefined;
  hard?: number | null | undefined;
}

/**
 * The rule a tray's finish values break, if any: its normal seedlings (the last cumulative count)
 * plus abnormal plus ungerminated must be the seeds sown, and fresh + dead + hard, when any is
 * given, the ungerminated. `field` is the value to correct, `hint` what would fit.
 */
export function finishProblem(
  tray: Pick<Tray, 'position' | 'seeds_sown'>,
  normal: number,
  entry: FinishEntry,
): { field: 'ungerminated' | 'fresh'; message: string; hint: string } | null {
  const total = normal + entry.abnormal + entry.ungerminated;
  // A tray not counted has no total to add up to: only the split of its ungerminated is checked.
  if (tray.seeds_sown !== null && total !== tray.seeds_sown) {
    return {
      field: 'ungerminated',
      message: `Tray ${tray.position}: ${normal} normal + ${entry.abnormal} abnormal + ${entry.ungerminated} ungerminated = ${total}, but ${tray.seeds_sown} seeds were sown.`,
      hint: `Should make the tray add up to ${tray.seeds_sown}.`,
    };
  }
  const detailGiven = [entry.fresh, entry.dead, entry.hard].some((v) => v != null);
  const split = (entry.fresh ?? 0) + (entry.dead ?? 0) + (entry.hard ?? 0);
  if (detailGiven && split !== entry.ungerminated) {
    return {
      field: 'fresh',
      message: `Tray ${tray.position}: fresh + dead + hard seeds (${split}) should equal the ${entry.ungerminated} ungerminated.`,
      hint: 'Should add up to the ungerminated seeds.',
    };
  }
  return null;
}

/**
 * A test sows seed that exists: it cannot start before the lot was harvested. A lot known only by
 * its packed-for season has no harvest day to check against.
 */
export function startBeforeHarvest(
  startDate: string,
  harvestDate: string | null,
  lotCode: string,
): string | null {
  if (harvestDate === null || startDate >= harvestDate) return null;
  return `The test starts on ${dayInWords(startDate)}, before lot ${lotCode} was harvested (${dayInWords(harvestDate)}). Check the start date, or the lot's harvest date.`;
}
