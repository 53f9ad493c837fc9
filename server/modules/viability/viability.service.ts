import { addYears, daysBetween } from '#shared/dates';
import { dayInWords } from '#shared/day-words';
import { YEAR_DAYS, seedAgeYears } from '#shared/seed-age';
import { z } from 'zod';
import { roughScoreSchema, type RoughScore } from '#shared/schemas/germination';
import type { SpeciesDto } from '#shared/schemas/species';
import type { RankingItem as RankingRow } from '#shared/schemas/viability';
import { systemClock, todayInZone, type Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { notFound, unprocessable } from '#server/http/errors';
import { seedsToSowPredictive, temperatureFactor } from '#server/stats/index';
import {
  fitSpeciesModel,
  monitoringIntervalYears,
  projectModel,
  viabilityDistribution,
  type LotModel,
  type ModelAssay,
} from '#server/stats/viability-model';
import { listSpecies } from '../species/species.shared.repository';
import { lotsForDecisions, type DecisionLot } from '../lots/lots.shared.repository';
import { emergenceOfSpecies, type EmergenceRow } from '../plan/plan.shared.repository';
import { fieldEmergence, type FieldEmergencePoint } from './field-emergence';
import * as repo from './viability.repository';
import { assayAggregates, viabilityStamps, type AssayAggregate } from './viability.repository';
import {
  decide,
  FIRST_ASSAY_SEEDS,
  perPlantWords,
  retestDueDate,
  sowsThick,
  straddles,
  type Recommendation,
} from './recommend';

/**
 * When the seed was harvested, as the model's age zero. A bought packet "packed for" season S was
 * most likely harvested the autumn before: we take 1 September of S − 1 (our assumption).
 */
export function harvestReference(lot: {
  harvestDate: string | null;
  packedForSeason: number | null;
}): string {
  return lot.harvestDate ?? `${(lot.packedForSeason ?? 2000) - 1}-09-01`;
}

export const ageYears = seedAgeYears;

/**
 * Storage scaling of the typical seed life. We read a handbook's "seed life under good storage"
 * (ISU Yard & Garden 1999, from Knott's Handbook) as storage in a cool dry room at about 15 °C —
 * our assumption — and scale σ to the lot's storage with the viability equation's universal
 * temperature terms (Dickie et al. 1990, Ann. Bot. 65:197–204). Without a recorded temperature a
 * fridge counts as 5 °C, a freezer as −18 °C and a room as 20 °C (common practice). An estimate.
 */
const REFERENCE_STORAGE_C = 15;
const PLACE_TEMPERATURE_C = { room: 20, fridge: 5, freezer: -18, other: null } as const;

export function storageTemperature(storage: {
  place: keyof typeof PLACE_TEMPERATURE_C | null;
  temperatureC: number | null;
}): number | null {
  if (storage.temperatureC !== null) return storage.temperatureC;
  return storage.place ? PLACE_TEMPERATURE_C[storage.place] : null;
}

/** The trays of a stored result scored roughly instead of counted, with their expected seeds sown. */
const scoredTraysSchema = z.array(
  z.object({
    state: z.string(),
    score: roughScoreSchema.nullable().optional(),
    sownMean: z.number().optional(),
  }),
);
function scoredTrays(t: AssayAggregate): { score: RoughScore; sown: number }[] {
  const parsed = scoredTraysSchema.safeParse(t.tray_percents);
  if (!parsed.success) return [];
  return parsed.data.flatMap((tr) =>
    tr.state === 'scored' && tr.score && tr.sownMean ? [{ score: tr.score, sown: tr.sownMean }] : [],
  );
}

/**
 * A test counts toward the decline once finished, or once counted (or scored) up to the species'
 * final count day, when it has counted trays or roughly scored ones.
 */
function usable(t: AssayAggregate, species: SpeciesDto | undefined): boolean {
  if (t.set_aside_reason !== null) return false;
  const counted = t.sown !== null && t.germinated !== null && t.sown > 0;
  if (!counted && scoredTrays(t).length === 0) return false;
  if (t.status === 'finished') return true;
  const final = species?.traits.finalCountDay;
  return final != null && t.last_count_date !== null && daysBetween(t.start_date, t.last_count_date) >= final;
}

/** A usable test as the lot page's chart and the model read it. */
export interface ViabilityPoint {
  testId: string;
  date: string;
  /** Calendar years since the harvest reference. */
  ageYears: number;
  /** The stored result's percentage; null when only rough scores (or too many seedlings) were given. */
  percent: number | null;
  /** Seedlings and (expected) seeds sown of the counted trays; null when none was counted. */
  germinated: number | null;
  sown: number | null;
  /** SD of the true number sown (0 when counted). */
  sownSd: number;
  /** The stored result's 95% interval, percent; null without a percentage. */
  interval: { low: number; high: number } | null;
  /** Fresh (dormant but alive) seeds, when recorded. */
  fresh: number | null;
  /** Trays scored roughly instead of counted. */
  scored: { score: RoughScore; sown: number }[];
}

/**
 * How a usable test enters the model (docs/viability-model.md, "Evidence weaker than a counted
 * test"). Counted trays: the binomial of their seedlings (plus fresh seeds) and seeds sown. Trays
 * sown by weight or guess: evidence 'estimated', the binomial averaged over the number truly sown
 * (the estimate's mean and SD, pooled over the test's counted trays). Each roughly scored tray: the
 * chance of its score band (evidence 'score').
 */
function modelAssaysOf(p: ViabilityPoint, age: number): ModelAssay[] {
  const out: ModelAssay[] = [];
  if (p.germinated !== null && p.sown !== null) {
    const alive = p.germinated + (p.fresh ?? 0);
    out.push(
      p.sownSd > 0
        ? { id: p.testId, age, alive, sown: p.sown, evidence: { kind: 'estimated', sownSd: p.sownSd } }
        : { id: p.testId, age, alive, sown: p.sown },
    );
  }
  p.scored.forEach((tr, i) =>
    out.push({
      id: `${p.testId}:scored:${String(i)}`,
      age,
      alive: 0,
      sown: tr.sown,
      evidence: { kind: 'score', score: tr.score },
    }),
  );
  return out;
}

export interface LotViability {
  model: LotModel | null;
  assays: ViabilityPoint[];
  /** Tests the grower set aside, with their reasons: out of the model, shown apart. */
  setAside: { testId: string; date: string; reason: string }[];
  /** What came up from sowings of the lot, oldest first; each sowing's latest is in the model. */
  emergence: FieldEmergencePoint[];
  lastAssay: AssayAggregate | null;
  harvestRef: string;
  /** Equivalent years at the species' reference storage per calendar year at the lot's storage. */
  rateFactor: number;
  storageNote: string | null;
  reasonNoFit: string | null;
}

type LotFit = Pick<LotViability, 'model' | 'reasonNoFit'>;

/** One species' fitted lots in one bank, with what they were fitted from. */
interface SpeciesFits {
  /** The species' viability stamp when its lots and tests were read (see viabilityStamps). */
  stamp: string;
  /** The species traits the fits read. */
  traits: string;
  byLot: Map<string, LotViability>;
}

/**
 * Fitted lots by bank and species, most recently used last. A species' lots are fitted together
 * (they share the species' rate); an entry is current while the species' stamp (moved by the
 * database on every change to its lots' dates or storage and to their tests), its traits and its
 * set of lots are unchanged. A stale entry is simply fitted again.
 */
export class FitCache {
  private readonly entries = new Map<string, SpeciesFits>();
  constructor(private readonly capacity = 256) {}

  get(key: string): SpeciesFits | undefined {
    const hit = this.entries.get(key);
    if (hit) {
      this.entries.delete(key);
      this.entries.set(key, hit);
    }
    return hit;
  }

  set(key: string, fits: SpeciesFits): void {
    this.entries.delete(key);
    this.entries.set(key, fits);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
  }
}

/** The storage's rate of ageing against the reference storage, and its note for the grower. */
function storageScale(lot: DecisionLot): { rateFactor: number; note: string | null } {
  const temp = storageTemperature(lot.storage);
  if (temp === null) {
    return { rateFactor: 1, note: 'Storage temperature not recorded: taken as a cool room (about 15 °C).' };
  }
  const factor = temperatureFactor(temp, REFERENCE_STORAGE_C);
  return {
    rateFactor: 1 / factor,
    note: `Storage at about ${Math.round(temp)} °C ages seed about ${factor >= 1 ? `${factor.toFixed(1)}× slower` : `${(1 / factor).toFixed(1)}× faster`} than a cool room (an estimate from the viability equation's temperature terms; seed moisture is not modelled).`,
  };
}

/** Fits one species' lots together, from their usable tests. */
function fitSpecies(
  group: DecisionLot[],
  assays: AssayAggregate[],
  sp: SpeciesDto | undefined,
  sowings: EmergenceRow[] = [],
): Map<string, LotViability> {
  const assaysByLot = new Map<string, AssayAggregate[]>();
  for (const t of assays) {
    const list = assaysByLot.get(t.lot_id);
    if (list) list.push(t);
    else assaysByLot.set(t.lot_id, [t]);
  }
  const sowingsByLot = new Map<string, EmergenceRow[]>();
  for (const e of sowings) {
    const list = sowingsByLot.get(e.lot_id);
    if (list) list.push(e);
    else sowingsByLot.set(e.lot_id, [e]);
  }
  const prepared = group.map((lot) => {
    const ref = harvestReference(lot);
    const all = assaysByLot.get(lot.id) ?? [];
    const points: ViabilityPoint[] = all
      .filter((t) => usable(t, sp))
      .map((t) => ({
        testId: t.id,
        date: t.start_date,
        ageYears: Math.max(0, ageYears(ref, t.start_date)),
        percent: t.percent,
        germinated: t.sown !== null && t.sown > 0 ? t.germinated : null,
        sown: t.sown !== null && t.sown > 0 && t.germinated !== null ? t.sown : null,
        sownSd: t.sown_sd ?? 0,
        interval:
          t.interval_low !== null && t.interval_high !== null
            ? { low: t.interval_low, high: t.interval_high }
            : null,
        fresh: t.fresh,
        scored: scoredTrays(t),
      }));
    const scale = storageScale(lot);
    const modelAssays: ModelAssay[] = points.flatMap((p) => modelAssaysOf(p, p.ageYears * scale.rateFactor));
    const emergence = fieldEmergence(
      sowingsByLot.get(lot.id) ?? [],
      (date) => Math.max(0, ageYears(ref, date)),
      scale.rateFactor,
    );
    modelAssays.push(...emergence.evidence);
    return { lot, ref, all, points, scale, modelAssays, emergence: emergence.points };
  });
  const results = fitSpeciesModel(
    prepared.map((p) => ({ id: p.lot.id, assays: p.modelAssays })),
    { typicalLifeYears: sp?.traits.storageLifeYears ?? null },
  );
  const fits = new Map<string, LotFit>(
    results.map((r) => [
      r.ok ? r.model.lotId : r.lotId,
      r.ok
        ? { model: r.model, reasonNoFit: null }
        : { model: null, reasonNoFit: `The decline cannot be estimated: ${r.reason}` },
    ]),
  );
  return new Map(
    prepared.map((p) => [
      p.lot.id,
      {
        ...fits.get(p.lot.id)!,
        assays: p.points,
        setAside: p.all
          .filter((t) => t.set_aside_reason !== null)
          .map((t) => ({ testId: t.id, date: t.start_date, reason: t.set_aside_reason! })),
        emergence: p.emergence,
        lastAssay: p.all.filter((t) => t.set_aside_reason === null).at(-1) ?? null,
        harvestRef: p.ref,
        rateFactor: p.scale.rateFactor,
        storageNote: p.scale.note,
      },
    ]),
  );
}

/**
 * Every given lot fitted, species by species, through the cache: `lots` holds every lot of each
 * species it names (a species' lots are fitted together), read after `stamps`, so a fit cached under
 * a stamp was made from data at least as new as the stamp.
 */
async function fitLots(
  db: Db,
  bankId: string,
  stamps: Map<string, string>,
  lots: DecisionLot[],
  species: Map<string, SpeciesDto>,
  cache: FitCache,
): Promise<Map<string, LotViability>> {
  const lotsBySpecies = new Map<string, DecisionLot[]>();
  for (const lot of lots) {
    const group = lotsBySpecies.get(lot.speciesId);
    if (group) group.push(lot);
    else lotsBySpecies.set(lot.speciesId, [lot]);
  }
  const out = new Map<string, LotViability>();
  const stale: { speciesId: string; key: string; stamp: string; traits: string; group: DecisionLot[] }[] = [];
  for (const [speciesId, group] of lotsBySpecies) {
    // One order for a fit whatever order the caller read the lots in (codes can be renamed).
    group.sort((x, y) => (x.id < y.id ? -1 : x.id > y.id ? 1 : 0));
    const t = species.get(speciesId)?.traits;
    const traits = JSON.stringify([t?.storageLifeYears ?? null, t?.finalCountDay ?? null]);
    const key = `${bankId}:${speciesId}`;
    const stamp = stamps.get(speciesId) ?? '0';
    const hit = cache.get(key);
    if (
      hit &&
      hit.stamp === stamp &&
      hit.traits === traits &&
      hit.byLot.size === group.length &&
      group.every((l) => hit.byLot.has(l.id))
    ) {
      for (const lot of group) out.set(lot.id, hit.byLot.get(lot.id)!);
    } else {
      stale.push({ speciesId, key, stamp, traits, group });
    }
  }
  const assays = await assayAggregates(
    db,
    bankId,
    stale.map((s) => s.speciesId),
  );
  const sowings = await emergenceOfSpecies(
    db,
    bankId,
    stale.map((s) => s.speciesId),
  );
  const lotSpecies = new Map(lots.map((l) => [l.id, l.speciesId]));
  const assaysBySpecies = new Map<string, AssayAggregate[]>();
  for (const t of assays) {
    const sp = lotSpecies.get(t.lot_id);
    if (sp === undefined) continue;
    const list = assaysBySpecies.get(sp);
    if (list) list.push(t);
    else assaysBySpecies.set(sp, [t]);
  }
  for (const [i, s] of stale.entries()) {
    // A bank's first fits can take seconds: let other requests in between species.
    if (i > 0) await new Promise((resolve) => setImmediate(resolve));
    const byLot = fitSpecies(
      s.group,
      assaysBySpecies.get(s.speciesId) ?? [],
      species.get(s.speciesId),
      sowings.filter((e) => e.species_id === s.speciesId),
    );
    cache.set(s.key, { stamp: s.stamp, traits: s.traits, byLot });
    for (const [id, v] of byLot) out.set(id, v);
  }
  return out;
}

/** Projected viability on a date, from the lot's model. */
/**
 * Figures derived from a cached model, memoised on it: the ranking asks for the same sowing date
 * over and over, and a model object lives exactly as long as its inputs are unchanged.
 */
const derived = new WeakMap<LotModel, Map<string, unknown>>();
const memo = <T>(model: LotModel, key: string, compute: () => T): T =>
  memoOn(derived as WeakMap<LotModel, Map<string, T>>, model, key, compute, 64);

function projectOn(v: LotViability, on: string) {
  const model = v.model;
  if (!model) return null;
  const age = Math.max(0, ageYears(v.harvestRef, on)) * v.rateFactor;
  return memo(model, `p:${age}`, () => projectModel(model, age));
}

/** For each lot, whether the bank holds a younger active lot of its species and variety. */
function youngerLots(all: DecisionLot[]): (lot: DecisionLot) => boolean {
  const key = (l: DecisionLot) => `${l.speciesId}\u0000${l.variety.trim().toLowerCase()}`;
  const newest = new Map<string, string>();
  for (const l of all) {
    if (l.status !== 'active') continue;
    const ref = harvestReference(l);
    if ((newest.get(key(l)) ?? '') < ref) newest.set(key(l), ref);
  }
  return (lot) => (newest.get(key(lot)) ?? '') > harvestReference(lot);
}

/** Storage places a grower can move a lot to, for the storage advice (temperatures as above). */
const ADVICE_PLACES = [
  { place: 'room', label: 'where it is kept now' },
  { place: 'fridge', label: 'in the fridge (about 5 °C)' },
  { place: 'freezer', label: 'in the freezer (about −18 °C)' },
] as const;

/**
 * Calendar years from `on` until the lot's projected viability (posterior mean) falls to `threshold`
 * percent when it ages `rateFactor` equivalent years a calendar year from now on; 0 when it is
 * already below, null when it stays above for 100 years.
 */
function yearsUntil(model: LotModel, ageEqNow: number, rateFactor: number, threshold: number): number | null {
  const at = (years: number) => projectModel(model, ageEqNow + years * rateFactor).percent;
  if (at(0) <= threshold) return 0;
  if (at(100) > threshold) return null;
  let lo = 0;
  let hi = 100;
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if (at(mid) > threshold) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

export function createViabilityService({ db, clock = systemClock }: { db: Db; clock?: Clock }) {
  const cache = new FitCache();
  /** Decisions memoised on the fit they read (see decision). */
  const decisions = new WeakMap<LotViability, Map<string, ReturnType<typeof decide_>>>();
  /** Ranking rows memoised on the fit they read, with their rendered form once asked for. */
  const rankingRows = new WeakMap<LotViability, Map<string, { item: RankingRow; rendered?: Buffer }>>();
  async function bankSettings(bankId: string) {
    const bank = await repo.viabilitySettings(db, bankId);
    return {
      threshold: bank.sow_threshold_percent,
      establishment: Number(bank.establishment_factor),
      assurance: Number(bank.sowing_assurance),
      /** The bank's calendar day: a test's age is counted to it. */
      today: todayInZone(clock, bank.time_zone),
    };
  }
  type Settings = Awaited<ReturnType<typeof bankSettings>>;

  const thresholdFor = (bankThreshold: number) => (s: SpeciesDto | undefined) =>
    s?.traits.minGerminationPercent ?? bankThreshold;

  /** Seeds the bank's unsown plan entries need, by lot. */
  async function seedsNeededByLot(bankId: string): Promise<Map<string, number>> {
    const rows = await repo.unsownSeedsByLot(db, bankId);
    return new Map(rows.map((r) => [r.lot_id!, r.seeds]));
  }

  /**
   * The decision for one lot on `on`, with everything the rules read. One place for every screen.
   * Memoised on the lot's fit (which lives while its inputs are unchanged) by the other inputs.
   */
  function decision(
    lot: DecisionLot,
    v: LotViability,
    hasYounger: (lot: DecisionLot) => boolean,
    sp: SpeciesDto | undefined,
    settings: Settings,
    seedsNeeded: number | null,
    on: string,
  ) {
    const younger = hasYounger(lot);
    const threshold = thresholdFor(settings.threshold)(sp);
    return memoOn(decisions, v, decisionKey(lot, younger, threshold, sp, settings, seedsNeeded, on), () =>
      decide_(lot, v, younger, threshold, sp, settings, seedsNeeded, on),
    );
  }

  /** Everything besides the fit that a decision reads, as a memo key. */
  const decisionKey = (
    lot: DecisionLot,
    younger: boolean,
    threshold: number,
    sp: SpeciesDto | undefined,
    settings: Settings,
    seedsNeeded: number | null,
    on: string,
  ) =>
    `${on}|${settings.today}|${threshold}|${sp?.traits.minGerminationPercent != null}|${settings.establishment}|${lot.seedsOnHand}|${seedsNeeded}|${younger}`;

  function decide_(
    lot: DecisionLot,
    v: LotViability,
    younger: boolean,
    threshold: number,
    sp: SpeciesDto | undefined,
    settings: Settings,
    seedsNeeded: number | null,
    on: string,
  ) {
    const projected = projectOn(v, on);
    const nextSeason = projectOn(v, addYears(on, 1));
    const lastUsable = v.assays.at(-1) ?? null;
    const model = v.model;
    const monitoring = model
      ? memo(model, 'monitoring', () => monitoringIntervalYears(model)) / v.rateFactor
      : null;
    const latest = v.lastAssay && v.lastAssay.percent !== null ? v.lastAssay : null;
    const d: { recommendation: Recommendation; reason: string } = decide({
      on,
      today: settings.today,
      seedsOnHand: lot.seedsOnHand,
      seedsNeeded,
      tested: v.assays.length > 0,
      assayRunning: v.lastAssay?.status === 'running',
      estimateOnly: v.model?.estimateOnly ?? true,
      projected,
      projectedNextSeason: nextSeason,
      initialPercent: v.model?.initial.percent ?? null,
      lastTestDate: lastUsable?.date ?? null,
      monitoringIntervalDays: monitoring === null ? null : monitoring * YEAR_DAYS,
      threshold,
      thresholdIsStandard: sp?.traits.minGerminationPercent != null,
      establishment: settings.establishment,
      youngerLotOfVariety: younger,
      // Untested lots have their own words in the rules; only a failed fit needs its reason.
      noFitReason: v.assays.length > 0 ? v.reasonNoFit : null,
      latestResult: latest ? { percent: latest.percent!, low: latest.percent!, high: latest.percent! } : null,
    });
    const retestBy =
      lastUsable && monitoring !== null && projected
        ? retestDueDate(lastUsable.date, monitoring * YEAR_DAYS, straddles(projected, threshold))
        : null;
    return { ...d, projected, retestBy, threshold };
  }

  /** The lot's decline, fitted together with the species' other lots in the bank. */
  async function lotViability(bankId: string, lotId: string) {
    const settings = await bankSettings(bankId);
    const found = await repo.lotSpecies(db, bankId, lotId);
    if (!found) throw notFound('No such lot in this bank.');
    // The stamps before the lots and tests they vouch for (see fitLots).
    const stamps = await viabilityStamps(db, bankId);
    const siblings = await lotsForDecisions(db, bankId, found.species_id);
    const lot = siblings.find((l) => l.id === lotId);
    if (!lot) throw notFound('No such lot in this bank.');
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
    const result = (await fitLots(db, bankId, stamps, siblings, species, cache)).get(lot.id)!;
    return { lot, siblings, settings, species: species.get(lot.speciesId), ...result };
  }

  /** Seeds to sow from the whole predictive distribution (null when no number will do). */
  function seedsFor(
    v: LotViability,
    on: string,
    plants: number,
    establishment: number,
    assurance: number,
  ): number | null {
    if (!v.model) return null;
    const draws = viabilityDistribution(v.model, Math.max(0, ageYears(v.harvestRef, on)) * v.rateFactor).map(
      (d) => ({ p: d.p * establishment, w: d.w }),
    );
    return seedsToSowPredictive(plants, draws, assurance);
  }

  /** The bank's active and depleted lots with their projections and decisions, as ranking rows. */
  async function rankingRowsOf(bankId: string, on: string) {
    const settings = await bankSettings(bankId);
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
    // The stamps before the lots and tests they vouch for (see fitLots).
    const stamps = await viabilityStamps(db, bankId);
    const all = await lotsForDecisions(db, bankId);
    const fits = await fitLots(db, bankId, stamps, all, species, cache);
    const needed = await seedsNeededByLot(bankId);
    const hasYounger = youngerLots(all);
    return all
      .filter((l) => l.status === 'active' || l.status === 'depleted')
      .map((lot) => {
        const v = fits.get(lot.id)!;
        const sp = species.get(lot.speciesId);
        const seedsNeeded = needed.get(lot.id) ?? null;
        const younger = hasYounger(lot);
        const threshold = thresholdFor(settings.threshold)(sp);
        // Everything a row shows besides its fit.
        const key = `${decisionKey(lot, younger, threshold, sp, settings, seedsNeeded, on)}|${lot.code}|${lot.speciesName}|${lot.variety}|${lot.status}|${lot.origin}|${lot.sourceName}|${lot.treated}|${lot.thumbUrl}`;
        return memoOn(rankingRows, v, key, (): { item: RankingRow; rendered?: Buffer } => {
          const d = decision(lot, v, hasYounger, sp, settings, seedsNeeded, on);
          const last = v.lastAssay;
          return {
            item: {
              lotId: lot.id,
              code: lot.code,
              speciesId: lot.speciesId,
              species: lot.speciesName,
              variety: lot.variety,
              status: lot.status,
              origin: lot.origin,
              sourceName: lot.sourceName,
              treated: lot.treated,
              ageYears: ageYears(v.harvestRef, on),
              lastTestDate: last?.start_date ?? null,
              lastPercent: last?.percent ?? null,
              lastPercentEstimated: last?.percent != null && (last.sown_sd ?? 0) > 0,
              lastScore: last && last.percent === null ? (scoredTrays(last).at(-1)?.score ?? null) : null,
              projectedPercent: d.projected?.percent ?? null,
              projectedLow: d.projected?.low ?? null,
              projectedHigh: d.projected?.high ?? null,
              meanDays: last?.mean_days ?? null,
              seedsOnHand: lot.seedsOnHand,
              basis: v.model?.basis ?? null,
              estimateOnly: v.model?.estimateOnly ?? true,
              retestBy: d.retestBy,
              thumbUrl: lot.thumbUrl,
              recommendation: d.recommendation,
              reason: d.reason,
            },
          };
        });
      });
  }

  return {
    /** Today on the bank's calendar (its time zone): the date advice is given for when none is asked. */
    async today(bankId: string): Promise<string> {
      return (await bankSettings(bankId)).today;
    },
    async viability(bankId: string, lotId: string, on: string) {
      const v = await lotViability(bankId, lotId);
      const ageOn = ageYears(v.harvestRef, on);
      const needed = (await seedsNeededByLot(bankId)).get(lotId) ?? null;
      const d = decision(v.lot, v, youngerLots(v.siblings), v.species, v.settings, needed, on);
      const maxAge = Math.max(ageOn, ...v.assays.map((t) => t.ageYears), 1) * 1.25;
      const ageEqNow = Math.max(0, ageOn) * v.rateFactor;
      const storageAdvice = v.model
        ? ADVICE_PLACES.map(({ place, label }) => {
            const rateFactor =
              place === 'room'
                ? v.rateFactor
                : 1 /
                  temperatureFactor(storageTemperature({ place, temperatureC: null })!, REFERENCE_STORAGE_C);
            return {
              place,
              label,
              current: place === 'room',
              yearsToThreshold: yearsUntil(v.model!, ageEqNow, rateFactor, d.threshold),
            };
          })
        : [];
      return {
        lotId: v.lot.id,
        on,
        ageYears: ageOn,
        initialPercent: v.model?.initial.percent ?? null,
        sigmaYears: v.model ? v.model.sigmaYears / v.rateFactor : null,
        halfLifeYears: v.model ? v.model.halfLifeYears / v.rateFactor : null,
        projected: d.projected,
        retestBy: d.retestBy,
        retestReason: d.retestBy ? 'monitoring-interval' : null,
        basis: v.model?.basis ?? null,
        estimateOnly: v.model?.estimateOnly ?? true,
        recommendation: d.recommendation,
        reason: d.reason,
        threshold: d.threshold,
        notes: [
          ...(v.model ? v.model.notes : [v.reasonNoFit ?? 'No estimate yet.']),
          ...(v.storageNote ? [v.storageNote] : []),
        ],
        harvestReference: v.harvestRef,
        storageAdvice,
        // The chart's points: tests with a percentage (a test with only rough scores has none).
        points: v.assays.flatMap((t) =>
          t.percent === null || t.germinated === null || t.sown === null
            ? []
            : [
                {
                  testId: t.testId,
                  date: t.date,
                  ageYears: t.ageYears,
                  percent: t.percent,
                  germinated: t.germinated,
                  sown: t.sown,
                  seedsSownEstimated: t.sownSd > 0,
                  low: t.interval?.low ?? null,
                  high: t.interval?.high ?? null,
                  heldBack: v.model?.heldBack.includes(t.testId) ?? false,
                },
              ],
        ),
        setAside: v.setAside,
        emergence: v.emergence,
        curve: v.model
          ? Array.from({ length: 41 }, (_, i) => {
              const age = (maxAge * i) / 40;
              return { ageYears: age, ...projectModel(v.model!, age * v.rateFactor) };
            })
          : [],
      };
    },

    // Packet pages
    /**
     * What a lot's public packet page says of its germination (server/modules/packet): the latest
     * usable test (set-aside tests left out, as in the ranking) and the projection for `on` from the
     * same fit the lot page shows, with how thickly to sow by the same rule as the advice. Nothing
     * of the bank's stock, plan or other lots: the decision's own reason speaks of those, so it
     * stays on the lot page.
     */
    async packetFigures(bankId: string, lotId: string, on: string) {
      const v = await lotViability(bankId, lotId);
      const projected = v.model ? projectOn(v, on) : null;
      const threshold = thresholdFor(v.settings.threshold)(v.species);
      const last = v.lastAssay && v.lastAssay.percent !== null ? v.lastAssay : null;
      return {
        lastTest: last
          ? {
              date: last.start_date,
              percent: last.percent!,
              estimated: (last.sown_sd ?? 0) > 0,
              running: last.status === 'running',
            }
          : null,
        projected,
        /** The projection is the species' typical figure, not a test of this lot. */
        estimateOnly: v.model?.estimateOnly ?? true,
        threshold,
        thresholdIsStandard: v.species?.traits.minGerminationPercent != null,
        /** Seeds per plant wanted, in words, when the band's low end is under the threshold. */
        sowThick:
          projected && !(v.model?.estimateOnly ?? true) && sowsThick(projected, threshold)
            ? perPlantWords(projected.percent, v.settings.establishment)
            : null,
        /** Seeds in a first test at home, for a lot without a figure of its own. */
        firstTestSeeds: FIRST_ASSAY_SEEDS,
      };
    },

    async seedsToSow(bankId: string, lotId: string, plants: number, on: string, assurance?: number) {
      const v = await lotViability(bankId, lotId);
      const needed = (await seedsNeededByLot(bankId)).get(lotId) ?? null;
      const d = decision(v.lot, v, youngerLots(v.siblings), v.species, v.settings, needed, on);
      if (d.recommendation === 'retire')
        throw unprocessable(`${d.reason} Hilum offers no seeds-to-sow for a lot to retire.`);
      if (!v.model || !d.projected)
        throw unprocessable(
          `${v.reasonNoFit ?? 'No estimate yet.'} Test the lot before working out how many seeds to sow.`,
        );
      const chosen = assurance ?? v.settings.assurance;
      const seeds = seedsFor(v, on, plants, v.settings.establishment, chosen);
      if (seeds === null)
        throw unprocessable('The projected germination is too low: no number of seeds gives that assurance.');
      const estimate = v.model.estimateOnly;
      return {
        seeds,
        germinationUsed: (d.projected.percent / 100) * v.settings.establishment,
        assurance: chosen,
        plants,
        projectedPercent: d.projected.percent,
        projectedLow: d.projected.low,
        projectedHigh: d.projected.high,
        establishmentFactor: v.settings.establishment,
        basis: v.model.basis,
        estimateOnly: estimate,
        // Null when the lot's amount is not known: neither enough nor short.
        enoughStock: v.lot.seedsOnHand === null ? null : seeds <= v.lot.seedsOnHand,
        seedsOnHand: v.lot.seedsOnHand,
        explanation: estimate
          ? `Not tested — this is a guess from the species' typical seed: sow about ${seeds} seeds for ${plants} plants (likely ${Math.round(d.projected.low)}–${Math.round(d.projected.high)}% on ${dayInWords(on)}). Test 20 seeds first for a real figure.`
          : `Sow ${seeds} seeds for ${plants} plants: the lot is projected at ${Math.round(d.projected.percent)}% (likely ${Math.round(d.projected.low)}–${Math.round(d.projected.high)}%) on ${dayInWords(on)}, times ${Math.round(v.settings.establishment * 100)}% of seedlings that make a plant, with ${Math.round(chosen * 100)}% assurance of at least ${plants} over that whole range.`,
      };
    },

    /**
     * The species' lots that could fill a plan entry on `on`, best first: highest projected lower
     * bound among those with enough seed, then the rest (not enough seed) after them. Lots to retire
     * and untested lots are not offered.
     */
    async candidates(bankId: string, speciesId: string, on: string, plants: number) {
      const settings = await bankSettings(bankId);
      const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
      // Every lot of the species is fitted, as on the lot page and in the ranking (one model).
      const stamps = await viabilityStamps(db, bankId);
      const all = await lotsForDecisions(db, bankId, speciesId);
      const fits = await fitLots(db, bankId, stamps, all, species, cache);
      const needed = await seedsNeededByLot(bankId);
      const hasYounger = youngerLots(all);
      const out = [];
      for (const lot of all.filter((l) => l.status === 'active')) {
        const v = fits.get(lot.id)!;
        const d = decision(
          lot,
          v,
          hasYounger,
          species.get(speciesId),
          settings,
          needed.get(lot.id) ?? null,
          on,
        );
        if (!d.projected || !v.model || v.model.estimateOnly || d.recommendation === 'retire') continue;
        const seeds = seedsFor(v, on, plants, settings.establishment, settings.assurance);
        if (seeds === null) continue;
        out.push({
          lotId: lot.id,
          code: lot.code,
          projected: d.projected,
          seeds,
          seedsOnHand: lot.seedsOnHand,
          // Null when the lot's amount is not known: it may hold enough, or not.
          enough: lot.seedsOnHand === null ? null : seeds <= lot.seedsOnHand,
        });
      }
      const stockRank = (enough: boolean | null) => (enough === null ? 1 : enough ? 2 : 0);
      return out.sort(
        (a, b) => stockRank(b.enough) - stockRank(a.enough) || b.projected.low - a.projected.low,
      );
    },

    /**
     * Every active or depleted lot with its projection and a recommendation. Every lot of the bank
     * is fitted (a retired lot's tests still tell its species' decline), as on the lot page.
     */
    async ranking(bankId: string, on: string): Promise<RankingRow[]> {
      return (await rankingRowsOf(bankId, on)).map((r) => r.item);
    },

    /**
     * The ranking as JSON text, each row rendered by `render` (the response schema's allowlist,
     * then JSON) once per fit and inputs and kept with the fit: a bank of thousands of lots is
     * served without rebuilding rows nobody changed.
     */
    async rankingJson(bankId: string, on: string, render: (item: RankingRow) => Buffer): Promise<Buffer> {
      const rows = await rankingRowsOf(bankId, on);
      const parts: Buffer[] = [Buffer.from(`{"on":${JSON.stringify(on)},"items":[`)];
      rows.forEach((r, i) => {
        if (i > 0) parts.push(COMMA);
        parts.push((r.rendered ??= render(r.item)));
      });
      parts.push(Buffer.from(']}'));
      return Buffer.concat(parts);
    },
  };
}

const COMMA = Buffer.from(',');

/**
 * Memoises `compute` on `owner` (a fit or a model, each living exactly while its inputs are
 * unchanged) by `key`, keeping at most about `limit` keys per owner.
 */
function memoOn<O extends object, T>(
  memo: WeakMap<O, Map<string, T>>,
  owner: O,
  key: string,
  compute: () => T,
  limit = 16,
): T {
  let m = memo.get(owner);
  if (!m) memo.set(owner, (m = new Map()));
  if (!m.has(key)) {
    if (m.size > limit) m.clear();
    m.set(key, compute());
  }
  return m.get(key)!;
}

export type ViabilityService = ReturnType<typeof createViabilityService>;
