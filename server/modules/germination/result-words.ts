import { dayInWords } from '#shared/day-words';
import type { AssaySummary } from '#server/stats/index';

// The words of a test's result, from its stored summary. One definition of a seedling throughout:
// the counts are of normal seedlings (sound root and shoot), as the seed-testing rules count them;
// abnormal seedlings are recorded apart at the finish; of the seeds that did not germinate, fresh
// ones are dormant but alive, hard ones never took up water (reported apart: 7 CFR 201.21, 201.30).

const pct = (v: number) => `${String(Math.round(v))}%`;
const days = (v: number) => (Math.round(v * 10) / 10).toString();
const seeds = (n: number, one: string, many: string) => `${String(n)} ${n === 1 ? one : many}`;
const pWords = (p: number) => (p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(p < 0.1 ? 3 : 2)}`);

/** "Tray 3", "Trays 3 and 4", "Trays 1, 3 and 4" (tray number = position in the summary + 1). */
function trayList(numbers: readonly number[]): string {
  if (numbers.length === 1) return `Tray ${String(numbers[0])}`;
  return `Trays ${numbers.slice(0, -1).join(', ')} and ${String(numbers.at(-1))}`;
}

function leftOutWords(r: AssaySummary, finished: boolean): string[] {
  const out: string[] = [];
  const notCounted = r.trayPercents.flatMap((t, i) => (t.state === 'not-counted' ? [i + 1] : []));
  if (notCounted.length > 0) {
    const one = notCounted.length === 1;
    out.push(
      finished
        ? `${trayList(notCounted)} ${one ? 'was' : 'were'} never counted and ${one ? 'is' : 'are'} left out of these figures.`
        : `${trayList(notCounted)} ${one ? 'is' : 'are'} not counted yet and ${one ? 'is' : 'are'} left out of these figures.`,
    );
  }
  r.trayPercents.forEach((t, i) => {
    if (t.state !== 'set-aside') return;
    const reason = t.setAsideReason ? ` (${t.setAsideReason})` : '';
    out.push(`Tray ${String(i + 1)} was set aside${reason} and is left out of every figure.`);
  });
  return out;
}

function agreementWords(r: AssaySummary, finished: boolean): string {
  const a = r.agreement;
  if (a.ok === null) {
    return finished
      ? 'Only one tray is in the figures, so whether the trays agree cannot be judged.'
      : 'Count at least two trays to see whether they agree.';
  }
  const causes = 'look for uneven moisture, warmth or a mix-up of seed, and consider testing again';
  if (a.method === 'chi-square') {
    const p = a.pValue === null ? '' : `, ${pWords(a.pValue)}`;
    return a.ok
      ? `The trays agree: for trays of these different sizes their percentages are as close as trays of one lot usually are (chi-square test${p}).`
      : `The trays differ more than chance explains for trays of these sizes (chi-square test${p}): ${causes}.`;
  }
  const observed = days(a.observedRange ?? 0);
  const allowed = days(a.maxRange ?? 0);
  return a.ok
    ? `The trays agree: they differ by ${observed} points, within the ${allowed} the seed-testing tolerance allows.`
    : `The trays differ by ${observed} points, more than the ${allowed} that chance explains: ${causes}.`;
}

/** The finish figures, when given: abnormal seedlings apart, then what became of the other seeds. */
function finishWords(r: AssaySummary): string[] {
  const out: string[] = [];
  if (r.abnormal !== null) {
    out.push(
      r.abnormal === 0
        ? 'No seedlings were abnormal.'
        : `${seeds(r.abnormal, 'seedling was', 'seedlings were')} abnormal (stunted or deformed): recorded apart, not in the germination.`,
    );
  }
  const parts = [
    r.fresh
      ? `${seeds(r.fresh, 'was', 'were')} fresh — dormant but alive; they may still come up after a rest or a cold spell`
      : null,
    r.hard
      ? `${seeds(r.hard, 'was', 'were')} hard — never took up water; reported apart, as the seed-testing rules do`
      : null,
    r.dead ? `${seeds(r.dead, 'was', 'were')} dead` : null,
  ].filter((p): p is string => p !== null);
  if (r.ungerminated !== null) {
    const head = `${seeds(r.ungerminated, 'seed', 'seeds')} did not germinate`;
    out.push(parts.length > 0 ? `${head}: of these, ${parts.join('; ')}.` : `${head}.`);
  } else if (parts.length > 0) {
    out.push(`Of the seeds that did not germinate, ${parts.join('; ')}.`);
  }
  return out;
}

function timingWords(r: AssaySummary): string[] {
  const out: string[] = [];
  if (r.t50Days !== null)
    out.push(`Half of the seedlings that came up had appeared by day ${days(r.t50Days)}.`);
  if (r.meanDays !== null) out.push(`On average a seedling took ${days(r.meanDays)} days to appear.`);
  if (r.timingNote !== null) out.push(r.timingNote);
  return out;
}

/**
 * What the numbers mean, in the plain words a grower reads at the bench. While a test runs the
 * words say "so far"; a finished test's words are final and add its finish figures.
 */
export function resultWords(r: AssaySummary, firstCountDate: string | null, finished = false): string[] {
  if (r.percent === null || r.sown === null || r.germinated === null) {
    const allAside = r.traysTotal > 0 && r.traysSetAside === r.traysTotal;
    if (allAside)
      return ['Every tray was set aside, so this test has no figures.', ...leftOutWords(r, finished)];
    if (finished) return ['No tray was counted, so this test has no figures.', ...leftOutWords(r, finished)];
    const first = firstCountDate
      ? `No counts yet. The first count is due around ${dayInWords(firstCountDate)}.`
      : 'No counts yet. On each check day, count the normal seedlings in each tray — those with a sound root and shoot.';
    return r.traysSetAside > 0 ? [first, ...leftOutWords(r, finished)] : [first];
  }
  const counted = `${seeds(r.germinated, 'normal seedling', 'normal seedlings')} from ${seeds(r.sown, 'seed', 'seeds')} sown`;
  const out = [
    finished
      ? `Germination: ${pct(r.percentRounded ?? r.percent)} — ${counted}${r.traysCounted < r.traysTotal ? ' in the trays kept' : ''}.`
      : `About ${pct(r.percent)} so far — ${counted} in the counted trays.`,
    ...leftOutWords(r, finished),
  ];
  if (finished) out.push(...finishWords(r));
  if (r.interval) {
    const method =
      r.interval.method === 'wilson' ? 'Wilson score interval' : 'exact Clopper–Pearson interval';
    out.push(
      `The lot's true germination is likely between ${pct(r.interval.low)} and ${pct(r.interval.high)} (${String(Math.round(r.interval.confidence * 100))}% ${method}).`,
    );
  }
  out.push(agreementWords(r, finished));
  out.push(...timingWords(r));
  return out;
}
