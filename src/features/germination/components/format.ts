import type { AssayDetail } from '#shared/schemas/germination';

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
