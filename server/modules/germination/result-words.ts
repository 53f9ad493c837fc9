import { dayInWords } from '../../../shared/day-words';
import type { TestSummary } from '../../stats';

const pct = (v: number) => `${Math.round(v)}%`;
const days = (v: number) => (Math.round(v * 10) / 10).toString();

/** What the numbers mean, in the plain words a grower reads at the bench. */
export function resultWords(r: TestSummary, firstCountDate: string | null): string[] {
  if (r.percent === null || r.sown === null || r.germinated === null) {
    return [
      firstCountDate
        ? `No counts yet. The first count is due around ${dayInWords(firstCountDate)}.`
        : 'No counts yet. Count the sprouted seeds in each tray on each check day.',
    ];
  }
  const out = [`About ${pct(r.percent)} came up so far (${r.germinated} of ${r.sown} seeds sown in the counted trays).`];
  if (r.interval) {
    const method = r.interval.method === 'wilson' ? 'Wilson score interval' : 'exact Clopper–Pearson interval';
    out.push(
      `The lot's true germination is likely between ${pct(r.interval.low)} and ${pct(r.interval.high)} (${Math.round(r.interval.confidence * 100)}% ${method}).`,
    );
  }
  const a = r.agreement;
  if (a.ok === null) {
    out.push('Count at least two trays to see whether they agree.');
  } else if (a.ok) {
    out.push(`The trays agree: they differ by ${days(a.observedRange ?? 0)} points, within the ${days(a.maxRange ?? 0)} the seed-testing tolerance allows.`);
  } else {
    out.push(
      `The trays differ by ${days(a.observedRange ?? 0)} points, more than the ${days(a.maxRange ?? 0)} that chance explains: look for uneven moisture, warmth or a mix-up of seed, and consider testing again.`,
    );
  }
  if (r.t50Days !== null) out.push(`Half of the seedlings that came up had appeared by day ${days(r.t50Days)}.`);
  if (r.meanDays !== null) out.push(`On average a seedling took ${days(r.meanDays)} days to appear.`);
  return out;
}
