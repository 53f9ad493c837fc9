import { dayInWords } from '#shared/day-words';
import { ROUGH_SCORE_WORDS, SOWN_GUESS_WORDS, type TraySownRead } from '#shared/schemas/germination';
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

/** Each tray's sowing by tray id (how it was sown, and the estimate when not counted). */
export type TraySowings = ReadonlyMap<string, TraySownRead>;

/** "0.2 g", "1.25 g", "12 g". */
export function gramsWords(g: number): string {
  return `${String(Number(g.toPrecision(3)))} g`;
}

/** What the estimated seeds sown of the counted trays came from: "0.2 g", "a pinch", "0.2 g and a pinch". */
function estimatedFrom(r: AssaySummary, sowings: TraySowings): string {
  const sown = r.trayPercents.filter((t) => t.state === 'counted').map((t) => sowings.get(t.id));
  const grams = sown.reduce((g, w) => g + (w?.by === 'weight' ? (w.grams ?? 0) : 0), 0);
  const parts = [
    ...(grams > 0 ? [gramsWords(grams)] : []),
    ...sown.flatMap((w) => (w?.by === 'guess' && w.about ? [SOWN_GUESS_WORDS[w.about]] : [])),
  ];
  const counted = sown.reduce((n, w) => n + (w?.by === 'count' ? (w.seeds ?? 0) : 0), 0);
  if (counted > 0) parts.push(`${String(counted)} counted`);
  return parts.length > 0 ? parts.join(' and ') : 'an estimate';
}

/** Whose seed weight turned grams into seeds, and whether chaff was allowed for. */
function estimateBasisWords(r: AssaySummary, sowings: TraySowings): string[] {
  const weighed = r.trayPercents
    .filter((t) => t.state === 'counted')
    .map((t) => sowings.get(t.id)?.estimate)
    .filter((e) => e?.basis != null);
  const guessed = r.trayPercents.some((t) => t.state === 'counted' && sowings.get(t.id)?.by === 'guess');
  const out: string[] = [];
  if (weighed.some((e) => e?.basis === 'species'))
    out.push(
      "Grams became seeds through the species' typical seeds per gram, which varies from lot to lot: weigh a sample of this lot's seeds for a closer figure.",
    );
  else if (weighed.length > 0) out.push("Grams became seeds through this lot's own seed weight.");
  if (weighed.some((e) => e?.purityAssumed))
    out.push(
      'No cleanliness figure for the lot: the material was taken as clean seed. Chaff in it means fewer seeds were sown, and a higher germination than shown.',
    );
  if (guessed)
    out.push(
      'A rough guess of seeds sown bounds the germination only loosely: count the seeds for a figure that says more.',
    );
  return out;
}

/** The rough scores of scored trays: "Seedlings came up: a few (tray 1, scored roughly)." */
function scoreWords(r: AssaySummary): string[] {
  return r.trayPercents.flatMap((t, i) =>
    t.state === 'scored' && t.score
      ? [
          `Seedlings came up: ${ROUGH_SCORE_WORDS[t.score]} (tray ${String(i + 1)}, scored roughly, not counted — no percentage is given for it).`,
        ]
      : [],
  );
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
  if (r.seedsSownEstimated)
    return 'Whether the trays agree is not judged: it needs the number of seeds sown in each tray.';
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
export function resultWords(
  r: AssaySummary,
  firstCountDate: string | null,
  finished = false,
  sowings: TraySowings = new Map(),
): string[] {
  if (r.seedlingsExceedSown && r.germinated !== null && r.sown !== null) {
    return [
      `${seeds(r.germinated, 'seedling', 'seedlings')} came up: more than the seeds sown could plausibly hold (estimated from ${estimatedFrom(r, sowings)}, about ${String(Math.round(r.sown))}), so no percentage can be given. The lot germinates well; count the seeds, or weigh a sample of the lot, for a figure.`,
      ...scoreWords(r),
      ...leftOutWords(r, finished),
      ...estimateBasisWords(r, sowings),
      ...timingWords(r),
    ];
  }
  if (r.percent === null || r.sown === null || r.germinated === null) {
    const allAside = r.traysTotal > 0 && r.traysSetAside === r.traysTotal;
    if (allAside)
      return ['Every tray was set aside, so this test has no figures.', ...leftOutWords(r, finished)];
    const scored = scoreWords(r);
    if (scored.length > 0) return [...scored, ...leftOutWords(r, finished)];
    if (finished) return ['No tray was counted, so this test has no figures.', ...leftOutWords(r, finished)];
    const first = firstCountDate
      ? `No counts yet. The first count is due around ${dayInWords(firstCountDate)}.`
      : 'No counts yet. On each check day, count the normal seedlings in each tray — those with a sound root and shoot.';
    return r.traysSetAside > 0 ? [first, ...leftOutWords(r, finished)] : [first];
  }
  const counted = r.seedsSownEstimated
    ? `${seeds(r.germinated, 'normal seedling', 'normal seedlings')} from about ${String(Math.round(r.sown))} seeds sown, estimated from ${estimatedFrom(r, sowings)}`
    : `${seeds(r.germinated, 'normal seedling', 'normal seedlings')} from ${seeds(r.sown, 'seed', 'seeds')} sown`;
  const about = r.seedsSownEstimated ? 'about ' : '';
  const out = [
    finished
      ? `Germination: ${about}${pct(r.percentRounded ?? r.percent)} — ${counted}${r.traysCounted < r.traysTotal ? ' in the trays kept' : ''}.`
      : `About ${pct(r.percent)} so far — ${counted} in the counted trays.`,
    ...scoreWords(r),
    ...leftOutWords(r, finished),
  ];
  if (finished) out.push(...finishWords(r));
  if (r.interval) {
    const method =
      r.interval.method === 'wilson'
        ? 'Wilson score interval'
        : r.interval.method === 'widened-score'
          ? 'score interval, widened because the seeds sown were estimated, not counted'
          : 'exact Clopper–Pearson interval';
    out.push(
      `The lot's true germination is likely between ${pct(r.interval.low)} and ${pct(r.interval.high)} (${String(Math.round(r.interval.confidence * 100))}% ${method}).`,
    );
  }
  if (r.seedsSownEstimated) out.push(...estimateBasisWords(r, sowings));
  out.push(agreementWords(r, finished));
  out.push(...timingWords(r));
  return out;
}
