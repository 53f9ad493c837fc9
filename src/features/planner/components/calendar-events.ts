import { addDays } from '#shared/dates';
import type { PlanEntryDto } from '#shared/schemas/plan';
import type { RankingItem } from '#shared/schemas/viability';
import { formatSeeds } from './plan-format';

export type CalendarKind = 'sow' | 'sprout' | 'harden' | 'plant-out' | 'sown' | 'retest';

export interface CalendarEvent {
  key: string;
  kind: CalendarKind;
  /** First and last day, ISO; the same for a one-day event. */
  from: string;
  to: string;
  title: string;
  detail: string;
  entryId?: string;
  lotId?: string;
}

/** In our words: what each mark on the calendar means, in the order of a season. */
export const KIND_LABELS: Record<CalendarKind, string> = {
  sow: 'Sowing window',
  sprout: 'Seedlings expected',
  harden: 'Harden off',
  'plant-out': 'Plant out',
  sown: 'Sown',
  retest: 'Retest due',
};

const ORDER: CalendarKind[] = ['sow', 'sown', 'sprout', 'harden', 'plant-out', 'retest'];

/** The season's days to mark: each entry's windows and days, and the lots' retest dates within the season. */
export function seasonEvents(
  season: number,
  entries: readonly PlanEntryDto[],
  lots: readonly RankingItem[],
): CalendarEvent[] {
  const events: CalendarEvent[] = [];
  for (const e of entries) {
    const lot = e.lotCode ? `lot ${e.lotCode}` : 'no lot yet';
    const seeds = e.seedsToSow !== null ? `${formatSeeds(e.seedsToSow)} seeds of ${lot}` : lot;
    const where = e.start === 'indoors' ? 'indoors' : 'direct';
    events.push({
      key: `${e.id}:sow`,
      kind: 'sow',
      from: e.sowFrom,
      to: e.sowTo,
      title: `Sow ${e.speciesName}`,
      detail: `${where}, ${seeds} for ${e.plantsWanted} plants`,
      entryId: e.id,
    });
    if (e.sownOn) {
      events.push({
        key: `${e.id}:sown`,
        kind: 'sown',
        from: e.sownOn,
        to: e.sownOn,
        title: `Sown: ${e.speciesName}`,
        detail: seeds,
        entryId: e.id,
      });
    }
    if (e.expectFrom && e.expectBy) {
      events.push({
        key: `${e.id}:sprout`,
        kind: 'sprout',
        from: e.expectFrom,
        to: e.expectBy,
        title: `Seedlings of ${e.speciesName}`,
        detail: 'from a sowing on the first day of the window',
        entryId: e.id,
      });
    }
    if (e.hardenFrom && e.transplantOn) {
      const last = addDays(e.transplantOn, -1);
      events.push({
        key: `${e.id}:harden`,
        kind: 'harden',
        from: e.hardenFrom,
        to: last < e.hardenFrom ? e.hardenFrom : last,
        title: `Harden off ${e.speciesName}`,
        detail: 'a few hours outside each day, longer day by day',
        entryId: e.id,
      });
    }
    if (e.transplantOn) {
      events.push({
        key: `${e.id}:out`,
        kind: 'plant-out',
        from: e.transplantOn,
        to: e.transplantOn,
        title: `Plant out ${e.speciesName}`,
        detail: 'after the last frost and the bank’s margin',
        entryId: e.id,
      });
    }
  }
  // Retests from the autumn before the season to its end: the time a grower prepares for it.
  const from = `${season - 1}-09-01`;
  const to = `${season}-12-31`;
  for (const lot of lots) {
    if (!lot.retestBy || lot.retestBy < from || lot.retestBy > to || lot.status !== 'active') continue;
    events.push({
      key: `${lot.lotId}:retest`,
      kind: 'retest',
      from: lot.retestBy,
      to: lot.retestBy,
      title: `Retest ${lot.code}`,
      detail: `${lot.species}, ${lot.variety}`,
      lotId: lot.lotId,
    });
  }
  return events.sort(
    (a, b) =>
      a.from.localeCompare(b.from) ||
      ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind) ||
      a.title.localeCompare(b.title),
  );
}

/**
 * The month the calendar opens on: this month when something falls in it; otherwise the next
 * month with something in it, so a grower opening the season in winter lands on the first
 * sowings rather than an empty page; for a season that is over, its first month. Null without
 * events.
 */
export function openingMonth(events: readonly CalendarEvent[], today: string): string | null {
  if (events.length === 0) return null;
  const now = today.slice(0, 7);
  const months = events.map((e) => ({ from: e.from.slice(0, 7), to: e.to.slice(0, 7) }));
  if (months.some((m) => m.from <= now && now <= m.to)) return now;
  const ahead = months
    .filter((m) => m.from > now)
    .map((m) => m.from)
    .sort();
  return ahead[0] ?? months.map((m) => m.from).sort()[0]!;
}
