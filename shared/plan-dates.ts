// Sowing-calendar arithmetic back from the frost date. Pure and shared: the server stores what
// it computes here and the client may preview it. Dates are ISO YYYY-MM-DD in the bank's calendar.
import { addDays, frostDateIn } from './dates';
import type { SpeciesTraits } from './schemas/species';

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
  /** When seedlings should show, counted from the first sowing day by the species' count days. */
  expectFrom: string | null;
  expectBy: string | null;
  hardenFrom: string | null;
  transplantOn: string | null;
  notes: string[];
}

export class PlanDateError extends Error {}

/** Days of hardening off before planting out (common practice: about a week). */
export const HARDEN_OFF_DAYS = 7;
/** Length of a direct-sowing window after the safe date (Hilum's choice). */
export const DIRECT_WINDOW_DAYS = 21;

export function planDates(input: {
  season: number;
  lastFrost: string | null;
  marginDays: number;
  traits: SpeciesTraits;
  start: 'indoors' | 'direct';
}): PlanDates {
  if (!input.lastFrost) {
    throw new PlanDateError(
      'Set the bank’s last spring frost date in Settings first: every sowing date counts back from it.',
    );
  }
  const lastFrost = frostDateIn(input.season, input.lastFrost);
  const safeAfter = addDays(lastFrost, input.marginDays);
  const { traits } = input;
  const notes: string[] = [];
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
    sowFrom = addDays(lastFrost, -7 * traits.startWeeksFrom);
    sowTo = addDays(lastFrost, -7 * traits.startWeeksTo);
    transplantOn = safeAfter;
    hardenFrom = addDays(safeAfter, -HARDEN_OFF_DAYS);
  } else {
    sowFrom = safeAfter;
    sowTo = addDays(safeAfter, DIRECT_WINDOW_DAYS);
    notes.push(
      'Direct sowing is set after the frost date plus margin; hardy crops can often go in earlier — follow local advice.',
    );
  }
  const expectFrom = traits.firstCountDay != null ? addDays(sowFrom, traits.firstCountDay) : null;
  const expectBy = traits.finalCountDay != null ? addDays(sowFrom, traits.finalCountDay) : null;
  return { lastFrost, safeAfter, sowFrom, sowTo, expectFrom, expectBy, hardenFrom, transplantOn, notes };
}
