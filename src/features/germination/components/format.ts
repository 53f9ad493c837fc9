import {
  ROUGH_SCORE_WORDS,
  SOWN_GUESS_WORDS,
  type AssayDetail,
  type RoughScore,
} from '#shared/schemas/germination';

const dateFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  timeZone: 'UTC',
});
const shortDateFormat = new Intl.DateTimeFormat('en-GB', {
  weekday: 'short',
  day: 'numeric',
  month: 'short',
  timeZone: 'UTC',
});

/** "10 Mar 2026" for an ISO date. */
export function formatDate(iso: string): string {
  const ms = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(ms) ? iso : dateFormat.format(ms);
}

/** "Tue 10 Mar" for an ISO date, for check days within one test. */
export function formatShortDate(iso: string): string {
  const ms = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(ms) ? iso : shortDateFormat.format(ms);
}

/** A whole percent for the screen; the server keeps full precision. */
export function formatPercent(value: number | null | undefined): string {
  return value === null || value === undefined ? '–' : `${Math.round(value)}%`;
}

/** Days to one decimal, the precision a daily check supports. */
export function formatDays(value: number | null | undefined): string {
  return value === null || value === undefined ? '–' : (Math.round(value * 10) / 10).toLocaleString('en-GB');
}

type Tray = AssayDetail['trays'][number];

/** "0.2 g", "1.25 g": a weight as the grower typed it, to three significant figures. */
export function formatGrams(g: number): string {
  return `${Number(g.toPrecision(3)).toLocaleString('en-GB')}\u00a0g`;
}

/** How a tray was sown, short: "25 sown", "0.2 g sown", "a pinch sown (not counted)". */
export function traySownWords(tray: Tray): string {
  if (tray.seedsSown !== null) return `${tray.seedsSown} sown`;
  if (tray.sown.by === 'weight' && tray.sown.grams !== null) return `${formatGrams(tray.sown.grams)} sown`;
  return `${tray.sown.about ? SOWN_GUESS_WORDS[tray.sown.about] : 'some'} sown (not counted)`;
}

/** The seeds a tray holds for a percentage: the count, else the estimate's expected number. */
export function traySeeds(tray: Tray): number {
  return tray.seedsSown ?? tray.sown.estimate?.mean ?? 0;
}

/** The seeds of a test's trays, in words: "4 trays, 100 seeds", "1 tray, 0.2 g (seeds not counted)". */
export function traysSownWords(trays: Tray[]): string {
  const head = `${trays.length} ${trays.length === 1 ? 'tray' : 'trays'}`;
  if (trays.every((t) => t.seedsSown !== null))
    return `${head}, ${trays.reduce((n, t) => n + (t.seedsSown ?? 0), 0)} seeds`;
  const grams = trays.reduce((g, t) => g + (t.sown.grams ?? 0), 0);
  const about = Math.round(trays.reduce((n, t) => n + traySeeds(t), 0));
  return `${head}, ${grams > 0 ? `${formatGrams(grams)}, ` : ''}about ${about} seeds (not all counted)`;
}

/** "a few" for a rough score. */
export const scoreWords = (score: RoughScore): string => ROUGH_SCORE_WORDS[score];

/**
 * The result's headline figure: "62%", "about 62%" when the seeds sown were estimated, the rough
 * score's words when the trays were only scored ("a few came up"), or "–".
 */
export function resultFigure(result: AssayDetail['result']): string {
  if (result.percent !== null) {
    const p = formatPercent(result.percentRounded ?? result.percent);
    return result.seedsSownEstimated ? `about ${p}` : p;
  }
  const scored = result.trayPercents.filter((t) => t.state === 'scored' && t.score !== null);
  if (scored.length > 0) return `${scoreWords(scored.at(-1)!.score!)} came up`;
  if (result.seedlingsExceedSown) return 'more than sown';
  return '–';
}

/** "likely between 78% and 89%" for the result's interval, or null while there is none. */
export function intervalWords(result: AssayDetail['result']): string | null {
  const interval = result.interval;
  if (!interval) return null;
  return `likely between ${formatPercent(interval.low)} and ${formatPercent(interval.high)}`;
}

export const pretreatmentLabels: Record<AssayDetail['test']['pretreatment'], string> = {
  none: 'None',
  soak: 'Soaked in water',
  'cold-stratification': 'Cold stratification',
  scarification: 'Scarified (seed coat nicked or sanded)',
};

/** One line describing how a test was set up: method, medium, warmth, light, pre-treatment. */
export function setupWords(assay: AssayDetail['test']): string {
  const parts = [assay.method];
  if (assay.medium) parts.push(assay.medium);
  if (assay.temperatureC !== null) parts.push(`${assay.temperatureC}\u00a0°C`);
  if (assay.lightHours !== null)
    parts.push(assay.lightHours === 0 ? 'dark' : `${assay.lightHours} h light a day`);
  if (assay.pretreatment !== 'none') {
    const label = pretreatmentLabels[assay.pretreatment].toLowerCase();
    parts.push(assay.pretreatmentDays !== null ? `${label}, ${assay.pretreatmentDays} days` : label);
  }
  return parts.join(' · ');
}
