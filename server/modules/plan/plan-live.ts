// The one place a plan entry's dates come from. An unsown entry's dates are worked out on every
// read from the bank's frost dates and margin and the species' traits as they are now (the bank's
// overrides included), so a change to any of them moves the plan at once; a sown entry keeps the
// dates it was sown under, with seedlings expected from its sowing day. Every reader — the plan
// list and entry, the .ics file, the calendar feed, reminders, the overview and the room under the
// lights — reads entries through here.
import type { Selectable } from 'kysely';
import { daysBetween, frostDateIn } from '#shared/dates';
import { dayInWords } from '#shared/day-words';
import { comingSeason, planDates, PlanDateError, type PlanDates } from '#shared/plan-dates';
import type { PlanMoveDto } from '#shared/schemas/plan';
import type { Hardiness, SpeciesTraits } from '#shared/schemas/species';
import type { DbOrTx } from '#server/db/database';
import type { PlanMoveTable } from '#server/db/schema';
import { listSpecies } from '../species/species.shared.repository';
import * as repo from './plan.repository';

/** An entry's dates now, with the notes on them and the hardiness they were planned with. */
export type LiveDates = Pick<
  PlanDates,
  'sowFrom' | 'sowTo' | 'expectFrom' | 'expectBy' | 'hardenFrom' | 'transplantOn' | 'notes'
> & { hardiness: Hardiness | null } & SeedDates;

/**
 * A sowing for seed: the season its seed is harvested in, and for a biennial the winter between —
 * from the first autumn frost of the sowing season to the last spring frost of the seed season.
 * All null for a sowing not for seed.
 */
export interface SeedDates {
  seedSeason: number | null;
  overwinterFrom: string | null;
  overwinterTo: string | null;
}

/** What every entry's dates are worked out from: read once per request. */
export interface DateInputs {
  lastFrost: string | null;
  /** The bank's first autumn frost, MM-DD (a biennial for seed goes into winter then). */
  firstFrost: string | null;
  marginDays: number;
  traits: Map<string, SpeciesTraits>;
}

export async function dateInputs(db: DbOrTx, bankId: string): Promise<DateInputs> {
  const [bank, species] = await Promise.all([repo.frostSettings(db, bankId), listSpecies(db, bankId)]);
  return {
    lastFrost: bank.last_frost,
    firstFrost: bank.first_frost,
    marginDays: bank.frost_margin_days,
    traits: new Map(species.map((s) => [s.id, s.traits])),
  };
}

type EntryDateFields = Pick<
  repo.PlanEntryRow,
  | 'season'
  | 'species_id'
  | 'start'
  | 'offset_days'
  | 'sown_on'
  | 'sow_from'
  | 'sow_to'
  | 'expect_from'
  | 'expect_by'
  | 'harden_from'
  | 'transplant_on'
  | 'for_seed'
>;

const stored = (e: EntryDateFields) => ({
  sowFrom: e.sow_from,
  sowTo: e.sow_to,
  expectFrom: e.expect_from,
  expectBy: e.expect_by,
  hardenFrom: e.harden_from,
  transplantOn: e.transplant_on,
});

/**
 * The entry's dates now: live while unsown, kept once sown. `sowingOn` works out the dates an
 * entry is being sown under on that day (seedlings expected counted from it), to keep them.
 */
export function entryDates(inputs: DateInputs, e: EntryDateFields, sowingOn?: string): LiveDates {
  const { seed, seedNotes } = seedDates(inputs, e);
  const dated = (d: Omit<LiveDates, keyof SeedDates>): LiveDates => ({
    ...d,
    ...seed,
    notes: [...d.notes, ...seedNotes],
  });
  const traits = inputs.traits.get(e.species_id);
  const hardiness = traits?.hardiness ?? null;
  if (e.sown_on && !sowingOn) return dated({ ...stored(e), notes: [], hardiness });
  try {
    if (!traits) throw new PlanDateError('The species of this entry is gone.');
    const d = planDates({
      season: e.season,
      lastFrost: inputs.lastFrost,
      marginDays: inputs.marginDays,
      traits,
      start: e.start,
      offsetDays: e.offset_days,
      sownOn: sowingOn ?? null,
    });
    return dated({ ...d, hardiness });
  } catch (error) {
    if (!(error instanceof PlanDateError)) throw error;
    // The frost date was cleared or the species' window removed since: the last dates planned stand.
    return dated({
      ...stored(e),
      hardiness,
      notes: [`These are the dates planned before; they cannot be worked out now: ${error.message}`],
    });
  }
}

/**
 * A sowing for seed, worked out on every read like the other dates: an annual's seed comes in its
 * own season; a biennial (the species' `biennial`) grows this season, is kept through the winter
 * and flowers and sets seed the next.
 */
function seedDates(inputs: DateInputs, e: EntryDateFields): { seed: SeedDates; seedNotes: string[] } {
  const none = { seed: { seedSeason: null, overwinterFrom: null, overwinterTo: null }, seedNotes: [] };
  if (!e.for_seed) return none;
  if (!inputs.traits.get(e.species_id)?.biennial)
    return {
      seed: { seedSeason: e.season, overwinterFrom: null, overwinterTo: null },
      seedNotes: [`For seed: it flowers and sets seed this season, ${e.season}.`],
    };
  const seedSeason = e.season + 1;
  const overwinterFrom = inputs.firstFrost ? frostDateIn(e.season, inputs.firstFrost) : null;
  const overwinterTo = inputs.lastFrost ? frostDateIn(seedSeason, inputs.lastFrost) : null;
  const from = overwinterFrom
    ? `from the first autumn frost (${dayInWords(overwinterFrom)})`
    : 'from the first autumn frost (set it in the bank’s settings to see the day)';
  const to = overwinterTo
    ? `to the last spring frost (${dayInWords(overwinterTo)})`
    : 'to the last spring frost';
  return {
    seed: { seedSeason, overwinterFrom, overwinterTo },
    seedNotes: [
      `For seed, over two seasons: a biennial grows in ${e.season}, is kept through the winter ${from} ${to} — in the ground under mulch, or lifted and stored cool — and flowers and sets seed in ${seedSeason}.`,
    ],
  };
}

/** Entries with their dates now, in sowing order (then by species name). */
export async function withLiveDates<R extends EntryDateFields & { species_name: string }>(
  db: DbOrTx,
  bankId: string,
  rows: R[],
): Promise<(R & { live: LiveDates })[]> {
  if (rows.length === 0) return [];
  const inputs = await dateInputs(db, bankId);
  return rows
    .map((r) => ({ ...r, live: entryDates(inputs, r) }))
    .sort(
      (a, b) =>
        a.live.sowFrom.localeCompare(b.live.sowFrom) ||
        a.species_name.localeCompare(b.species_name) ||
        a.offset_days - b.offset_days,
    );
}

/**
 * Every entry of the bank (or only the unsown) with its dates now, in the shape the overview and
 * reminders read: the dates as `sow_from`, `sow_to`, …, never the stored ones.
 */
export async function liveEntries(db: DbOrTx, bankId: string, only?: 'unsown') {
  const rows = await withLiveDates(db, bankId, await repo.listAll(db, bankId, only));
  return rows.map(({ live, ...r }) => ({
    ...r,
    common_name: r.species_name,
    code: r.lot_code,
    sow_from: live.sowFrom,
    sow_to: live.sowTo,
    expect_from: live.expectFrom,
    expect_by: live.expectBy,
    harden_from: live.hardenFrom,
    transplant_on: live.transplantOn,
  }));
}

const monthDayInWords = (season: number, monthDay: string) =>
  dayInWords(frostDateIn(season, monthDay)).replace(/ \d{4}$/, '');

export function moveDto(m: Selectable<PlanMoveTable>): PlanMoveDto {
  const sowings = m.entries === 1 ? '1 unsown sowing' : `${m.entries} unsown sowings`;
  const by = Math.abs(m.days) === 1 ? '1 day' : `${Math.abs(m.days)} days`;
  return {
    season: m.season,
    fromFrost: m.from_frost,
    toFrost: m.to_frost,
    days: m.days,
    entries: m.entries,
    message: `Last frost moved ${monthDayInWords(m.season, m.from_frost)} → ${monthDayInWords(m.season, m.to_frost)}: ${sowings} moved ${by} ${m.days > 0 ? 'later' : 'earlier'}; sown ones keep their dates.`,
    at: m.created_at.toISOString(),
  };
}

/**
 * Records, in the caller's transaction, what moving the bank's last frost `from` → `to` does to
 * each coming season's unsown sowings (every one moves by the same days; sown ones stay), and
 * returns it in words. Nothing is recorded for a season with no unsown sowing.
 */
export async function recordFrostMove(
  db: DbOrTx,
  bankId: string,
  from: string | null,
  to: string | null,
  today: string,
): Promise<PlanMoveDto[]> {
  if (!from || !to || from === to) return [];
  const seasons = await repo.unsownBySeason(db, bankId, comingSeason(today));
  const moves: PlanMoveDto[] = [];
  for (const s of seasons) {
    const days = daysBetween(frostDateIn(s.season, from), frostDateIn(s.season, to));
    if (days === 0) continue;
    const row = await repo.insertMove(db, {
      bank_id: bankId,
      season: s.season,
      from_frost: from,
      to_frost: to,
      days,
      entries: Number(s.n),
    });
    moves.push(moveDto(row));
  }
  return moves;
}
