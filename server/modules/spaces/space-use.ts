// Week by week, the room under the lights a season's indoor sowings take. Pure: the service hands
// it the plan entries as the plan service lists them (their live dates) and each species' traits.
//
// The model, in cells of a 72-cell tray (shared/species-space.ts):
// - an indoor sowing is on the bench from its sowing day (the day it was sown, else the first day
//   of its window) until it goes out to harden off (hardenFrom; else its planting-out day);
// - from sowing until potting up (sowing + 7 × weeks to potting up) it is in the seed tray, one
//   cell per seed sown (the plan's seeds to sow; the plants wanted when that is not known);
// - from potting up until it goes out, each plant wanted takes its cells per plant;
// - a week's use is the most cells in use on any one day of it (Monday to Sunday), so a week that
//   overflows for a day says so. Direct sowings take no room indoors.
import { addDays, daysBetween, weekdayOf } from '#shared/dates';
import { dayInWords } from '#shared/day-words';
import type { SpaceEntryDto, SpaceWeekDto } from '#shared/schemas/spaces';
import { DEFAULT_SPACE } from '#shared/species-space';

export interface SpaceInputEntry {
  id: string;
  speciesName: string;
  start: 'indoors' | 'direct';
  plantsWanted: number;
  seedsToSow: number | null;
  sowFrom: string;
  sownOn: string | null;
  hardenFrom: string | null;
  transplantOn: string | null;
}

export interface SpaceInputTraits {
  potUpWeeks?: number | null | undefined;
  cellsPerPlant?: number | null | undefined;
}

/** The Monday on or before a calendar day (weeks start on Monday, ISO 8601). */
export function mondayOf(day: string): string {
  return addDays(day, -((weekdayOf(day) + 6) % 7));
}

/** How one entry takes room, or null for one that takes none indoors. */
export function entrySpace(e: SpaceInputEntry, traits: SpaceInputTraits | undefined): SpaceEntryDto | null {
  if (e.start !== 'indoors') return null;
  const notes: string[] = [];
  const sowOn = e.sownOn ?? e.sowFrom;
  const freeOn = e.hardenFrom ?? e.transplantOn;
  if (!freeOn) return null;
  const potUpWeeks = traits?.potUpWeeks ?? DEFAULT_SPACE.potUpWeeks;
  const cellsPerPlant = traits?.cellsPerPlant ?? DEFAULT_SPACE.cellsPerPlant;
  if (traits?.potUpWeeks == null || traits?.cellsPerPlant == null)
    notes.push(
      `${e.speciesName} has no weeks to potting up or cells per plant: counted as potted up after ${potUpWeeks} weeks into ${cellsPerPlant} cells a plant (Hilum’s assumption).`,
    );
  let trayCells = e.seedsToSow ?? e.plantsWanted;
  if (e.seedsToSow === null)
    notes.push(`No seeds to sow worked out yet: the seed tray is counted as one cell per plant wanted.`);
  const potUp = addDays(sowOn, 7 * potUpWeeks);
  const potUpOn = potUp < freeOn ? potUp : null;
  if (potUpWeeks === 0) trayCells = 0;
  if (freeOn <= sowOn) notes.push(`Sown on ${dayInWords(sowOn)}, on or after it goes out to harden off.`);
  return {
    entryId: e.id,
    speciesName: e.speciesName,
    sowOn,
    potUpOn,
    freeOn,
    trayCells,
    potCells: potUpOn !== null ? e.plantsWanted * cellsPerPlant : 0,
    notes,
  };
}

/** Cells in use on each day from `first` (index 0) on, by adding each entry's stretches. */
function dailyUse(entries: SpaceEntryDto[], first: string, days: number): number[] {
  const use = new Array<number>(days).fill(0);
  const add = (from: string, to: string, cells: number) => {
    if (cells <= 0) return;
    const a = Math.max(0, daysBetween(first, from));
    const b = Math.min(days, daysBetween(first, to));
    for (let i = a; i < b; i++) use[i]! += cells;
  };
  for (const e of entries) {
    add(e.sowOn, e.potUpOn ?? e.freeOn, e.trayCells);
    if (e.potUpOn) add(e.potUpOn, e.freeOn, e.potCells);
  }
  return use;
}

/**
 * The weeks from the first sowing to the last day anything is under the lights, each with the most
 * cells in use on a day of it against `capacity` (cells). No indoor sowings: no weeks.
 */
export function weeklySpace(entries: SpaceEntryDto[], capacity: number): SpaceWeekDto[] {
  const onBench = entries.filter((e) => e.freeOn > e.sowOn);
  if (onBench.length === 0) return [];
  const first = mondayOf(onBench.map((e) => e.sowOn).reduce((a, b) => (a < b ? a : b)));
  const lastOut = onBench.map((e) => e.freeOn).reduce((a, b) => (a > b ? a : b));
  // freeOn is the first day off the bench: the last day on it is the day before.
  const weeks = Math.floor(daysBetween(first, addDays(lastOut, -1)) / 7) + 1;
  const use = dailyUse(onBench, first, weeks * 7);
  return Array.from({ length: weeks }, (_, w) => {
    const used = Math.max(...use.slice(w * 7, w * 7 + 7));
    return { weekStart: addDays(first, 7 * w), used, capacity, overflow: used > capacity };
  });
}
