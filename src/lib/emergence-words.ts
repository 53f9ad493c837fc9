import { dayInWords } from '#shared/day-words';
import type { EmergenceRecordDto, EmergenceScore } from '#shared/schemas/plan';

/** A rough score as a grower says it. */
export const SCORE_WORDS: Readonly<Record<EmergenceScore, string>> = {
  none: 'none',
  few: 'a few',
  half: 'about half',
  most: 'most',
};

/** "12 Mar 2027", or "12 Mar" when `year` is the date's own (it is said once in the sentence). */
function day(iso: string, year?: string): string {
  const words = dayInWords(iso);
  return year && iso.startsWith(year) ? words.slice(0, -5) : words;
}

/** What one look found, in words: "26 came up by 28 Mar (65%)", or "a few came up by 28 Mar". */
export function lookWords(
  r: Pick<EmergenceRecordDto, 'sownOn' | 'seedsSown' | 'date' | 'seedlings' | 'score'>,
): string {
  const by = day(r.date, r.sownOn.slice(0, 4));
  if (r.seedlings !== null) {
    const percent = Math.round((100 * r.seedlings) / r.seedsSown);
    return `${r.seedlings} came up by ${by} (${percent}%)`;
  }
  return `${r.score ? SCORE_WORDS[r.score] : 'none'} came up by ${by}`;
}

/**
 * What came up from a sowing in words, the same in the planner and on the lot page:
 * "Sown 40 on 12 Mar 2027; 26 came up by 28 Mar (65%)", or "…; a few came up by 28 Mar".
 */
export function cameUpWords(
  r: Pick<EmergenceRecordDto, 'sownOn' | 'seedsSown' | 'date' | 'seedlings' | 'score'>,
): string {
  return `Sown ${new Intl.NumberFormat('en-GB').format(r.seedsSown)} on ${day(r.sownOn)}; ${lookWords(r)}`;
}
