import type { QueryClient, QueryFilters, QueryKey } from '@tanstack/react-query';
import type { z } from 'zod';
import type { intervalMethodSchema } from '#shared/schemas/germination';
import type { lotStatusSchema } from '#shared/schemas/lots';

/*
 * Everything of one bank on the wire, written once: the API paths under /api/banks/:bankId
 * (../shared/API.md is their contract) and the query keys the cache files them under. Every
 * feature builds its paths and keys here, so a path is spelled in one place and a mutation can name
 * exactly which cached answers it makes stale (see `stale` below).
 *
 * Keys are hierarchical (TanStack Query's prefix matching): all of a bank sits under
 * ['banks', bankId]; a lot's own answers (stock, tests, decline, seeds to sow) under that lot's
 * record key; the ranking beside the lot lists, since both list lots.
 */

export type LotStatus = z.infer<typeof lotStatusSchema>;

/** The filters of the lot list, in its address and in its query key. */
export interface LotFilters {
  q?: string | undefined;
  speciesId?: string | undefined;
  status?: LotStatus | undefined;
}

/** Which 95% interval the server computes for a test: Wilson score (its default) or exact Clopper–Pearson. */
export type IntervalMethod = z.infer<typeof intervalMethodSchema>;

/** What a photo belongs to: a lot's packet, a parent plant, or a tray of a germination test. */
export type PhotoSubject = 'lot' | 'plant' | 'tray';

/**
 * A tray is found through its test (…/tests/:testId/trays/:trayId/photos), so a tray's subject id
 * names both: "<assayId>/<trayId>" (ids are UUIDs, which hold no slash).
 */
export const traySubjectId = (assayId: string, trayId: string) => `${assayId}/${trayId}`;

/** The query of a seeds-to-sow answer; without an assurance the server uses the bank's own. */
export interface SeedsToSowQuery {
  plants: number;
  on: string;
  assurance?: number;
}

const id = encodeURIComponent;
const bank = (bankId: string) => `/api/banks/${id(bankId)}`;
const lot = (bankId: string, lotId: string) => `${bank(bankId)}/lots/${id(lotId)}`;
const assay = (bankId: string, assayId: string) => `${bank(bankId)}/tests/${id(assayId)}`;
const planEntry = (bankId: string, entryId: string) => `${bank(bankId)}/plan/${id(entryId)}`;
const dryRun = (yes: boolean) => (yes ? '?dryRun=true' : '');

/** The API paths of a bank (GET unless a caller says otherwise). */
export const bankPaths = {
  bank,
  members: (bankId: string) => `${bank(bankId)}/members`,
  member: (bankId: string, userId: string) => `${bank(bankId)}/members/${id(userId)}`,
  leave: (bankId: string) => `${bank(bankId)}/leave`,
  invitations: (bankId: string) => `${bank(bankId)}/invitations`,
  invitation: (bankId: string, invitationId: string) => `${bank(bankId)}/invitations/${id(invitationId)}`,
  reminders: (bankId: string) => `${bank(bankId)}/reminders`,
  /** The signed-in member's private calendar feed address, and its rotation. */
  calendarFeed: (bankId: string) => `${bank(bankId)}/calendar-feed`,
  calendarFeedRotate: (bankId: string) => `${bank(bankId)}/calendar-feed/rotate`,
  overview: (bankId: string, on?: string) =>
    `${bank(bankId)}/overview${on ? `?${new URLSearchParams({ on })}` : ''}`,

  species: (bankId: string) => `${bank(bankId)}/species`,
  speciesOne: (bankId: string, speciesId: string) => `${bank(bankId)}/species/${id(speciesId)}`,
  speciesOverrides: (bankId: string, speciesId: string) =>
    `${bank(bankId)}/species/${id(speciesId)}/overrides`,

  lots: (bankId: string) => `${bank(bankId)}/lots`,
  lot,
  lotStock: (bankId: string, lotId: string) => `${lot(bankId, lotId)}/stock`,
  lotAssays: (bankId: string, lotId: string) => `${lot(bankId, lotId)}/tests`,
  lotViability: (bankId: string, lotId: string, on: string) =>
    `${lot(bankId, lotId)}/viability?${new URLSearchParams({ on })}`,
  lotSeedsToSow: (bankId: string, lotId: string, { plants, on, assurance }: SeedsToSowQuery) =>
    `${lot(bankId, lotId)}/seeds-to-sow?${new URLSearchParams({
      plants: String(plants),
      ...(assurance === undefined ? {} : { assurance: String(assurance) }),
      on,
    })}`,
  /** One packet label, 70 × 35 mm, as SVG; the browser loads it as an image (the session cookie goes along). */
  lotLabel: (bankId: string, lotId: string, giving = false) =>
    `${lot(bankId, lotId)}/label.svg${giving ? '?for=giving' : ''}`,
  /** The lot's public packet page: whether it is on (GET), on with a new address (POST), off (DELETE). */
  lotPacketPage: (bankId: string, lotId: string) => `${lot(bankId, lotId)}/packet-page`,
  lotsCsv: (bankId: string) => `${bank(bankId)}/lots.csv`,
  lotsImport: (bankId: string, preview: boolean) => `${bank(bankId)}/lots/import${dryRun(preview)}`,
  ranking: (bankId: string, on: string) => `${bank(bankId)}/ranking?${new URLSearchParams({ on })}`,

  assay: (bankId: string, assayId: string, interval: IntervalMethod = 'wilson') =>
    `${assay(bankId, assayId)}${interval === 'wilson' ? '' : `?${new URLSearchParams({ interval })}`}`,
  assayCounts: (bankId: string, assayId: string) => `${assay(bankId, assayId)}/counts`,
  assayCountsOn: (bankId: string, assayId: string, date: string) =>
    `${assay(bankId, assayId)}/counts/${id(date)}`,
  assayFinish: (bankId: string, assayId: string) => `${assay(bankId, assayId)}/finish`,
  assayReopen: (bankId: string, assayId: string) => `${assay(bankId, assayId)}/reopen`,
  assaySetAside: (bankId: string, assayId: string) => `${assay(bankId, assayId)}/set-aside`,
  tray: (bankId: string, assayId: string, trayId: string) => `${assay(bankId, assayId)}/trays/${id(trayId)}`,
  assaysCsv: (bankId: string) => `${bank(bankId)}/tests.csv`,
  assaysImport: (bankId: string, preview: boolean) => `${bank(bankId)}/tests/import${dryRun(preview)}`,

  plan: (bankId: string) => `${bank(bankId)}/plan`,
  planSeason: (bankId: string, season: number) =>
    `${bank(bankId)}/plan?${new URLSearchParams({ season: String(season) })}`,
  planEntry,
  planSown: (bankId: string, entryId: string) => `${planEntry(bankId, entryId)}/sown`,
  planEmergence: (bankId: string, entryId: string) => `${planEntry(bankId, entryId)}/emergence`,
  /** The season as an iCalendar file, for a download link. */
  planIcs: (bankId: string, season: number) =>
    `${bank(bankId)}/plan.ics?${new URLSearchParams({ season: String(season) })}`,

  /** The season's room under the lights, week by week. */
  planSpace: (bankId: string, season: number) =>
    `${bank(bankId)}/plan/space?${new URLSearchParams({ season: String(season) })}`,
  spaces: (bankId: string) => `${bank(bankId)}/spaces`,
  space: (bankId: string, spaceId: string) => `${bank(bankId)}/spaces/${id(spaceId)}`,

  plants: (bankId: string) => `${bank(bankId)}/plants`,
  plant: (bankId: string, plantId: string) => `${bank(bankId)}/plants/${id(plantId)}`,
  photos: (bankId: string, subject: PhotoSubject, subjectId: string) => {
    if (subject === 'tray') {
      const [assayId = '', trayId = ''] = subjectId.split('/');
      return `${assay(bankId, assayId)}/trays/${id(trayId)}/photos`;
    }
    return `${bank(bankId)}/${subject === 'lot' ? 'lots' : 'plants'}/${id(subjectId)}/photos`;
  },
  photo: (bankId: string, photoId: string) => `${bank(bankId)}/photos/${id(photoId)}`,
  // Keeping a variety true.
  lotKeepingTrue: (bankId: string, lotId: string) => `${lot(bankId, lotId)}/keeping-true`,
  growOut: (bankId: string) => `${bank(bankId)}/grow-out`,
};

/** The query keys of a bank, broadest first; invalidating a key refreshes every key below it. */
export const bankKeys = {
  all: ['banks'] as const,
  /** The bank and the caller's role (match it `exact`: it is also the prefix of everything below). */
  bank: (bankId: string) => [...bankKeys.all, bankId] as const,
  members: (bankId: string) => [...bankKeys.bank(bankId), 'members'] as const,
  invitations: (bankId: string) => [...bankKeys.bank(bankId), 'invitations'] as const,
  reminders: (bankId: string) => [...bankKeys.bank(bankId), 'reminders'] as const,
  calendarFeed: (bankId: string) => [...bankKeys.bank(bankId), 'calendar-feed'] as const,
  overviews: (bankId: string) => [...bankKeys.bank(bankId), 'overview'] as const,
  overview: (bankId: string, on: string | undefined) =>
    [...bankKeys.overviews(bankId), on ?? 'today'] as const,
  species: (bankId: string) => [...bankKeys.bank(bankId), 'species'] as const,
  speciesList: (bankId: string) => [...bankKeys.species(bankId), 'list'] as const,

  lots: (bankId: string) => [...bankKeys.bank(bankId), 'lots'] as const,
  /** Every list of lots: the filtered lists and the ranking. */
  lotLists: (bankId: string) => [...bankKeys.lots(bankId), 'list'] as const,
  lotList: (bankId: string, filters: LotFilters) => [...bankKeys.lotLists(bankId), filters] as const,
  rankings: (bankId: string) => [...bankKeys.lotLists(bankId), 'ranking'] as const,
  ranking: (bankId: string, on: string) => [...bankKeys.rankings(bankId), { on }] as const,
  /** The lot's record (match it `exact`), and the prefix of its stock, tests, decline and seeds to sow. */
  lot: (bankId: string, lotId: string) => [...bankKeys.lots(bankId), 'detail', lotId] as const,
  lotStock: (bankId: string, lotId: string) => [...bankKeys.lot(bankId, lotId), 'stock'] as const,
  lotAssays: (bankId: string, lotId: string) => [...bankKeys.lot(bankId, lotId), 'assays'] as const,
  lotViabilities: (bankId: string, lotId: string) => [...bankKeys.lot(bankId, lotId), 'viability'] as const,
  lotViability: (bankId: string, lotId: string, on: string) =>
    [...bankKeys.lotViabilities(bankId, lotId), { on }] as const,
  lotPacketPage: (bankId: string, lotId: string) => [...bankKeys.lot(bankId, lotId), 'packet-page'] as const,
  lotSeedsToSowAll: (bankId: string, lotId: string) =>
    [...bankKeys.lot(bankId, lotId), 'seeds-to-sow'] as const,
  lotSeedsToSow: (bankId: string, lotId: string, query: SeedsToSowQuery) =>
    [...bankKeys.lotSeedsToSowAll(bankId, lotId), query] as const,

  assays: (bankId: string) => [...bankKeys.bank(bankId), 'assays'] as const,
  assay: (bankId: string, assayId: string) => [...bankKeys.assays(bankId), assayId] as const,
  assayDetail: (bankId: string, assayId: string, interval: IntervalMethod) =>
    [...bankKeys.assay(bankId, assayId), { interval }] as const,

  plan: (bankId: string) => [...bankKeys.bank(bankId), 'plan'] as const,
  planSeason: (bankId: string, season: number) => [...bankKeys.plan(bankId), season] as const,

  /** Under the plan, so every plan change refreshes the room it takes. */
  planSpaces: (bankId: string) => [...bankKeys.plan(bankId), 'space'] as const,
  planSpace: (bankId: string, season: number) => [...bankKeys.planSpaces(bankId), season] as const,

  plants: (bankId: string) => [...bankKeys.bank(bankId), 'plants'] as const,
  plantList: (bankId: string) => [...bankKeys.plants(bankId), 'list'] as const,
  photos: (bankId: string) => [...bankKeys.bank(bankId), 'photos'] as const,
  photosOf: (bankId: string, subject: PhotoSubject, subjectId: string) =>
    [...bankKeys.photos(bankId), subject, subjectId] as const,
  // Keeping a variety true: a lot's warnings read its parent plants (refreshed with them); the
  // grow-out list reads the advice (refreshed with the overview, which every change to it refreshes).
  lotKeepingTrue: (bankId: string, lotId: string) =>
    [...bankKeys.plants(bankId), 'keeping-true', lotId] as const,
  growOut: (bankId: string) => [...bankKeys.overviews(bankId), 'grow-out'] as const,
};

const exact = (queryKey: QueryKey): QueryFilters => ({ queryKey, exact: true });
const under = (queryKey: QueryKey): QueryFilters => ({ queryKey });

/**
 * What a grower would otherwise see stale after a change, as query filters. Each change names the
 * answers the server derives from what it touched, and nothing else.
 */
export const stale = {
  /**
   * Seeds went into or out of a lot (a stock movement, a test started or deleted, a sowing marked or
   * undone): the lot's seeds on hand and status, its ledger and "enough stock" in seeds to sow; the
   * lot lists and ranking; the overview's low stock; the plan's seeds on hand.
   */
  stockMoved: (bankId: string, lotId: string) => [
    exact(bankKeys.lot(bankId, lotId)),
    under(bankKeys.lotStock(bankId, lotId)),
    under(bankKeys.lotSeedsToSowAll(bankId, lotId)),
    under(bankKeys.lotLists(bankId)),
    under(bankKeys.overviews(bankId)),
    under(bankKeys.plan(bankId)),
  ],
  /**
   * A lot's germination changed (a test started, counted, finished, reopened, set aside or
   * deleted): the lot's test list, decline and seeds to sow; the ranking's figures and advice; the
   * overview's trays to count, lots to retest and seeds due; the plan's seeds to sow and suggested lot.
   */
  germination: (bankId: string, lotId: string) => [
    under(bankKeys.lotAssays(bankId, lotId)),
    under(bankKeys.lotViabilities(bankId, lotId)),
    under(bankKeys.lotSeedsToSowAll(bankId, lotId)),
    under(bankKeys.rankings(bankId)),
    under(bankKeys.overviews(bankId)),
    under(bankKeys.plan(bankId)),
  ],
  /**
   * Lots came or went (created, imported, deleted or retired): the lists and ranking, the overview's
   * counts and the plan's suggested lots.
   */
  lotsAddedOrRemoved: (bankId: string) => [
    under(bankKeys.lotLists(bankId)),
    under(bankKeys.overviews(bankId)),
    under(bankKeys.plan(bankId)),
  ],
  /**
   * A lot's own fields changed (code, variety, harvest, storage, parents): everything shown of it —
   * its record and what the server derives from its harvest and storage (decline, seeds to sow,
   * the ranking), its tests' headings, the overview and the plan that name it.
   */
  lotEdited: (bankId: string, lotId: string) => [
    under(bankKeys.lot(bankId, lotId)),
    under(bankKeys.lotLists(bankId)),
    under(bankKeys.assays(bankId)),
    under(bankKeys.overviews(bankId)),
    under(bankKeys.plan(bankId)),
  ],
  /**
   * Values every projection reads changed (the bank's frost dates, time zone or assurance, a
   * species' traits): every lot answer, the plan and the overview; not the tests' own counts.
   */
  projections: (bankId: string) => [
    under(bankKeys.lots(bankId)),
    under(bankKeys.plan(bankId)),
    under(bankKeys.overviews(bankId)),
  ],
  /** A sowing planned, changed or dropped: the season's entries and the overview's sowings due. */
  plan: (bankId: string) => [under(bankKeys.plan(bankId)), under(bankKeys.overviews(bankId))],
  /** A growing space added, changed or removed: the room the plan has (which lists the spaces). */
  spaces: (bankId: string) => [under(bankKeys.planSpaces(bankId))],
  /** A parent plant added: the plant list (lots name their parents from it). */
  plantAdded: (bankId: string) => [under(bankKeys.plants(bankId))],
  /** A parent plant deleted: the plant list, and the lot records that named it as a parent (they lose the link). */
  plantRemoved: (bankId: string, plantId: string): QueryFilters[] => [
    under(bankKeys.plants(bankId)),
    {
      queryKey: bankKeys.lots(bankId),
      predicate: ({ state }) => {
        const parents = (state.data as { parentPlantIds?: unknown } | undefined)?.parentPlantIds;
        return Array.isArray(parents) && parents.includes(plantId);
      },
    },
  ],
  /** A photo added or deleted: that subject's photos, and the thumbnail a lot shows in its record and lists. */
  photos: (bankId: string, subject: PhotoSubject, subjectId: string) => [
    under(bankKeys.photosOf(bankId, subject, subjectId)),
    ...(subject === 'lot' ? [exact(bankKeys.lot(bankId, subjectId)), under(bankKeys.lotLists(bankId))] : []),
    // A plant's record carries its photos.
    ...(subject === 'plant' ? [under(bankKeys.plantList(bankId))] : []),
  ],
};

/** Marks the answers stale (those on screen refetch now, the rest when next shown); resolves once refetched. */
export async function refresh(queryClient: QueryClient, ...groups: QueryFilters[][]): Promise<void> {
  await Promise.all(groups.flat().map((filters) => queryClient.invalidateQueries(filters)));
}
