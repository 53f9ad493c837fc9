// Sowing-calendar arithmetic back from the frost date. Pure and shared: the server works out every
// unsown plan entry's dates here on each read, and the client may preview them. Dates are ISO YYYY-MM-DD in the bank's calendar.
import { addDays, frostDateIn } from './dates';
import type { Hardiness, SpeciesTraits } from './schemas/species';

/**
 * The season planned by default: the coming spring. From September on, today's calendar day in
 * the bank's time zone, that is next year's (Hilum's rule; spring sowing lies ahead by then).
 */
export function comingSeason(today: string): number {
  const year = Number(today.slice(0, 4));
  return Number(today.slice(5, 7)) >= 9 ? year + 1 : year;
}

export interface PlanDates {
  lastFrost: string;
  /** The last frost plus the bank's safety margin: when tender plants may go out. */
  safeAfter: string;
  sowFrom: string;
  sowTo: string;
  /**
   * When seedlings should show: the species' fewest days to emerge after the first sowing day, to
   * its most days after the last one (after the actual sowing day once sown).
   */
  expectFrom: string | null;
  expectBy: string | null;
  hardenFrom: string | null;
  transplantOn: string | null;
  notes: string[];
}

export class PlanDateError extends Error {}

/** Days of hardening off before planting out (common practice: about a week). */
export const HARDEN_OFF_DAYS = 7;
/** Length of a direct-sowing window for tender kinds, after the safe date (Hilum's choice). */
export const DIRECT_WINDOW_DAYS = 21;
/**
 * Seedlings go out no sooner than this many days after the last indoor sowing day, however hardy
 * (Hilum's choice: three weeks of growth and true leaves before hardening off).
 */
export const MIN_INDOOR_DAYS = 21;

/**
 * Planting out and sowing outside by cold hardiness, in days from the average last frost
 * (Purdue Extension HO-203, after University of Illinois VC-14, read through a page quoting it):
 * very hardy 4–6 weeks before, frost tolerant 2–3 weeks before, tender on or after, warm loving
 * 1–2 weeks after. Tender kinds also wait the bank's frost margin; hardy kinds are not harmed by a
 * late frost, so the margin does not apply to them.
 */
export const HARDINESS_DAYS: Record<Hardiness, { from: number; to: number; margin: boolean }> = {
  hardy: { from: -42, to: -28, margin: false },
  'half-hardy': { from: -21, to: -14, margin: false },
  tender: { from: 0, to: 0, margin: true },
  'very-tender': { from: 7, to: 14, margin: true },
};

/** Hardiness in words, as every screen and sentence says it. */
export const HARDINESS_WORDS: Record<Hardiness, string> = {
  hardy: 'hardy',
  'half-hardy': 'half-hardy',
  tender: 'tender',
  'very-tender': 'very tender',
};

/** When the plants (or seed) may go outside: the window's first and last day. */
function outsideWindow(
  lastFrost: string,
  marginDays: number,
  hardiness: Hardiness,
): { first: string; last: string } {
  const h = HARDINESS_DAYS[hardiness];
  const first = addDays(lastFrost, h.from + (h.margin ? marginDays : 0));
  // Tender kinds: "on or after" has no end, so the window is Hilum's three weeks.
  const last = h.margin ? addDays(first, DIRECT_WINDOW_DAYS) : addDays(lastFrost, h.to);
  return { first, last };
}

export function planDates(input: {
  season: number;
  lastFrost: string | null;
  marginDays: number;
  traits: SpeciesTraits;
  start: 'indoors' | 'direct';
  /** A later sowing of a succession: every date moves this many days later. */
  offsetDays?: number;
  /** The day it was actually sown: seedlings are expected counted from it. */
  sownOn?: string | null;
}): PlanDates {
  if (!input.lastFrost) {
    throw new PlanDateError(
      'Set the bank’s last spring frost date in Settings first: every sowing date counts back from it.',
    );
  }
  const lastFrost = frostDateIn(input.season, input.lastFrost);
  const safeAfter = addDays(lastFrost, input.marginDays);
  const { traits } = input;
  const shift = (date: string) => addDays(date, input.offsetDays ?? 0);
  const notes: string[] = [];
  const hardiness = traits.hardiness ?? 'tender';
  if (!traits.hardiness)
    notes.push(
      'This species’ hardiness is not set, so it is planned as tender: out after the frost date plus margin.',
    );
  const outside = outsideWindow(lastFrost, input.marginDays, hardiness);
  let sowFrom: string;
  let sowTo: string;
  let hardenFrom: string | null = null;
  let transplantOn: string | null = null;
  if (input.start === 'indoors') {
    if (traits.startWeeksFrom == null || traits.startWeeksTo == null) {
      throw new PlanDateError(
        'This species has no indoor start window. Set one for the species (weeks before the last frost), or sow it direct.',
      );
    }
    if (traits.startMethod === 'direct')
      notes.push(
        'This species is usually sown direct; starting it indoors may need care when transplanting.',
      );
    sowFrom = shift(addDays(lastFrost, -7 * traits.startWeeksFrom));
    sowTo = shift(addDays(lastFrost, -7 * traits.startWeeksTo));
    // Out at the late end of a hardy kind's window, the start of a tender kind's; never before the
    // seedlings are ready.
    const out = shift(HARDINESS_DAYS[hardiness].margin ? outside.first : outside.last);
    const ready = addDays(sowTo, MIN_INDOOR_DAYS);
    transplantOn = out > ready ? out : ready;
    hardenFrom = addDays(transplantOn, -HARDEN_OFF_DAYS);
  } else {
    sowFrom = shift(outside.first);
    sowTo = shift(outside.last);
    notes.push(
      `Sown outside as a ${HARDINESS_WORDS[hardiness]} crop, timed from the last frost; follow local advice.`,
    );
  }
  const emerge = {
    min: traits.emergeDaysMin ?? traits.firstCountDay,
    max: traits.emergeDaysMax ?? traits.finalCountDay,
  };
  const from = input.sownOn ?? sowFrom;
  const to = input.sownOn ?? sowTo;
  const expectFrom = emerge.min != null ? addDays(from, emerge.min) : null;
  const expectBy = emerge.max != null ? addDays(to, emerge.max) : null;
  return { lastFrost, safeAfter, sowFrom, sowTo, expectFrom, expectBy, hardenFrom, transplantOn, notes };
}
