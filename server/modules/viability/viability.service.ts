import { dayInWords } from '../../../shared/day-words';
import type { SpeciesDto } from '../../../shared/schemas/species';
import type { Db } from '../../db/database';
import { notFound, unprocessable } from '../../http/errors';
import {
  fitViabilityDecline,
  projectViability,
  seedsToSow,
  temperatureFactor,
  type SpeciesSlope,
  type ViabilityFit,
  type ViabilityTest,
} from '../../stats';
import { commonSlopeProbit } from '../../stats/probit-common-slope';
import { listSpecies } from '../species/species.service';
import { lotsQuery, toLotDto } from '../lots/lots.repository';
import { decide, type Recommendation } from './recommend';

const DAY_MS = 86_400_000;
const YEAR_DAYS = 365.25;
const isoDay = (d: Date) => d.toISOString().slice(0, 10);
const addDays = (date: string, n: number) => isoDay(new Date(Date.parse(date) + Math.round(n) * DAY_MS));

/**
 * When the seed was harvested, as the model's age zero. A bought packet "packed for" season S was
 * most likely harvested the autumn before: we take 1 September of S − 1 (our assumption).
 */
export function harvestReference(lot: { harvestDate: string | null; packedForSeason: number | null }): string {
  return lot.harvestDate ?? `${(lot.packedForSeason ?? 2000) - 1}-09-01`;
}

export const ageYears = (from: string, to: string) => (Date.parse(to) - Date.parse(from)) / DAY_MS / YEAR_DAYS;

/**
 * Storage scaling of the typical seed life. We read a handbook's "seed life under good storage"
 * (ISU Yard & Garden 1999, from Knott's Handbook) as storage in a cool dry room at about 15 °C —
 * our assumption — and scale σ to the lot's storage with the viability equation's universal
 * temperature terms (Dickie et al. 1990, Ann. Bot. 65:197–204). Without a recorded temperature a
 * fridge counts as 5 °C, a freezer as −18 °C and a room as 20 °C (common practice). An estimate.
 */
const REFERENCE_STORAGE_C = 15;
const PLACE_TEMPERATURE_C = { room: 20, fridge: 5, freezer: -18, other: null } as const;

export function storageTemperature(storage: { place: keyof typeof PLACE_TEMPERATURE_C | null; temperatureC: number | null }): number | null {
  if (storage.temperatureC !== null) return storage.temperatureC;
  return storage.place ? PLACE_TEMPERATURE_C[storage.place] : null;
}

/** A test as the model and the ranking read it: its stored result (germination/test-results.ts). */
interface TestAggregate {
  id: string;
  lot_id: string;
  start_date: string;
  status: 'running' | 'finished';
  /** Null while no tray of the test has been counted. */
  sown: number | null;
  germinated: number | null;
  percent: number | null;
  last_count_date: string | null;
  mean_days: number | null;
}

/** Every test of the bank (or of one species) with its stored result, oldest first. */
async function testAggregates(db: Db, bankId: string, speciesId?: string): Promise<TestAggregate[]> {
  let q = db
    .selectFrom('germination_tests as t')
    .select([
      't.id',
      't.lot_id',
      't.start_date',
      't.status',
      't.result_sown as sown',
      't.result_germinated as germinated',
      't.result_percent as percent',
      't.result_last_count_date as last_count_date',
      't.result_mean_days as mean_days',
    ])
    .where('t.bank_id', '=', bankId)
    .orderBy('t.start_date')
    .orderBy('t.created_at');
  if (speciesId) q = q.innerJoin('lots as l', 'l.id', 't.lot_id').where('l.species_id', '=', speciesId);
  return q.execute();
}

/** A test counts toward the decline once finished, or once counted up to the species' final count day. */
function usable(t: TestAggregate, species: SpeciesDto | undefined): t is TestAggregate & { sown: number; germinated: number } {
  if (t.sown === null || t.germinated === null || t.sown <= 0) return false;
  if (t.status === 'finished') return true;
  const final = species?.traits.finalCountDay;
  return final != null && t.last_count_date !== null && Date.parse(t.last_count_date) - Date.parse(t.start_date) >= final * DAY_MS;
}

export interface LotViability {
  fit: ViabilityFit | null;
  tests: (ViabilityTest & { date: string; testId: string })[];
  lastTest: TestAggregate | null;
  harvestRef: string;
  storageNote: string | null;
  reasonNoFit: string | null;
}

type LotDto = ReturnType<typeof toLotDto>;
type LotFit = Omit<LotViability, 'lastTest'>;

/**
 * Fitted models by their inputs. A species' lots are fitted together (they share a common slope),
 * so the key is everything the fits of one species read: the lots' age references and storage, the
 * usable tests' stored results, the species' traits and the threshold. Equal inputs give equal
 * fits, so a cached fit is never stale, and a change to any input simply misses the cache.
 */
export class FitCache {
  private readonly entries = new Map<string, Map<string, LotFit>>();
  constructor(private readonly capacity = 256) {}

  get(key: string): Map<string, LotFit> | undefined {
    const hit = this.entries.get(key);
    if (hit) {
      // Most recently used last.
      this.entries.delete(key);
      this.entries.set(key, hit);
    }
    return hit;
  }

  set(key: string, fits: Map<string, LotFit>): void {
    this.entries.set(key, fits);
    while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
  }
}

/** One species' lots fitted together: the common slope pooled once, then each lot. */
function fitSpeciesLots(lots: LotDto[], modelTests: Map<string, LotViability['tests']>, hasTests: Set<string>, sp: SpeciesDto | undefined, threshold: number) {
  // A lot with one test says nothing about the slope, so pooling every lot of the species that was
  // tested at two or more ages gives the same common slope as pooling "the other lots".
  const groups = lots.map((l) => modelTests.get(l.id)!).filter((own) => new Set(own.map((t) => t.ageYears)).size >= 2);
  let slope: SpeciesSlope | undefined;
  if (groups.length > 0) {
    try {
      const pooled = commonSlopeProbit(groups.map((g) => ({ points: g.map((t) => ({ x: t.ageYears, successes: t.germinated, trials: t.sown })) })));
      if (pooled.converged && pooled.slope < 0 && Number.isFinite(pooled.seSlope)) slope = { slope: pooled.slope, slopeSe: pooled.seSlope };
    } catch {
      // No usable common slope for this species; lots fall back to the typical life.
    }
  }
  const out = new Map<string, LotFit>();
  for (const lot of lots) {
    const own = modelTests.get(lot.id)!;
    const harvestRef = harvestReference(lot);
    const temp = storageTemperature(lot.storage);
    const factor = temp === null ? 1 : temperatureFactor(temp, REFERENCE_STORAGE_C);
    const storageNote =
      temp === null
        ? null
        : `Storage at about ${Math.round(temp)} °C ${factor >= 1 ? 'lengthens' : 'shortens'} the typical seed life about ${factor >= 1 ? factor.toFixed(1) : (1 / factor).toFixed(1)}× (an estimate from the viability equation's temperature terms).`;
    let fit: ViabilityFit | null = null;
    let reasonNoFit: string | null = null;
    if (own.length === 0) {
      reasonNoFit = hasTests.has(lot.id) ? 'The test is still running.' : 'No germination test yet.';
    } else {
      const life = sp?.traits.storageLifeYears;
      try {
        fit = fitViabilityDecline(own, { ...(slope ? { speciesSlope: slope } : {}), ...(life ? { typicalLifeYears: life * factor } : {}) }, { retestThresholdPercent: threshold });
        if (fit.basis === 'typical' && storageNote) fit.notes.push(storageNote);
      } catch (error) {
        reasonNoFit = `The decline cannot be estimated yet (${error instanceof Error ? error.message : 'no rate of decline known'}).`;
      }
    }
    out.set(lot.id, { fit, tests: own, harvestRef, storageNote, reasonNoFit });
  }
  return out;
}

/** Fits every lot of the given lists, species by species, through the cache. */
function fitLots(
  lots: LotDto[],
  tests: TestAggregate[],
  species: Map<string, SpeciesDto>,
  thresholdFor: (s: SpeciesDto | undefined) => number,
  cache: FitCache,
): Map<string, LotViability> {
  const testsByLot = new Map<string, TestAggregate[]>();
  for (const t of tests) {
    const list = testsByLot.get(t.lot_id);
    if (list) list.push(t);
    else testsByLot.set(t.lot_id, [t]);
  }
  const modelTests = new Map<string, LotViability['tests']>();
  const lotsBySpecies = new Map<string, LotDto[]>();
  for (const lot of lots) {
    const sp = species.get(lot.speciesId);
    const ref = harvestReference(lot);
    modelTests.set(
      lot.id,
      (testsByLot.get(lot.id) ?? [])
        .filter((t) => usable(t, sp))
        .map((t) => ({ ageYears: Math.max(0, ageYears(ref, t.start_date)), germinated: t.germinated!, sown: t.sown!, date: t.start_date, testId: t.id })),
    );
    const group = lotsBySpecies.get(lot.speciesId);
    if (group) group.push(lot);
    else lotsBySpecies.set(lot.speciesId, [lot]);
  }
  const hasTests = new Set(testsByLot.keys());

  const out = new Map<string, LotViability>();
  for (const [speciesId, group] of lotsBySpecies) {
    const sp = species.get(speciesId);
    const threshold = thresholdFor(sp);
    const key = JSON.stringify([
      speciesId,
      sp?.traits.storageLifeYears ?? null,
      threshold,
      group.map((l) => [l.id, harvestReference(l), storageTemperature(l.storage), hasTests.has(l.id), modelTests.get(l.id)!.map((t) => [t.testId, t.date, t.germinated, t.sown])]),
    ]);
    let fits = cache.get(key);
    if (!fits) {
      fits = fitSpeciesLots(group, modelTests, hasTests, sp, threshold);
      cache.set(key, fits);
    }
    for (const lot of group) out.set(lot.id, { ...fits.get(lot.id)!, lastTest: testsByLot.get(lot.id)?.at(-1) ?? null });
  }
  return out;
}

export function createViabilityService({ db }: { db: Db }) {
  const cache = new FitCache();
  async function bankSettings(bankId: string) {
    const bank = await db
      .selectFrom('banks')
      .select(['sow_threshold_percent', 'establishment_factor', 'sowing_assurance'])
      .where('id', '=', bankId)
      .executeTakeFirstOrThrow();
    return {
      threshold: bank.sow_threshold_percent,
      establishment: Number(bank.establishment_factor),
      assurance: Number(bank.sowing_assurance),
    };
  }

  const thresholdFor = (bankThreshold: number) => (s: SpeciesDto | undefined) => s?.traits.minGerminationPercent ?? bankThreshold;

  /** The lot's decline, fitted together with the species' other lots in the bank. */
  async function lotViability(bankId: string, lotId: string) {
    const settings = await bankSettings(bankId);
    const lotRow = await lotsQuery(db, bankId).where('lots.id', '=', lotId).executeTakeFirst();
    if (!lotRow) throw notFound('No such lot in this bank.');
    const lot = toLotDto(lotRow);
    const siblings = (await lotsQuery(db, bankId).where('lots.species_id', '=', lot.speciesId).orderBy('lots.code').execute()).map(toLotDto);
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
    const tests = await testAggregates(db, bankId, lot.speciesId);
    const result = fitLots(siblings, tests, species, thresholdFor(settings.threshold), cache).get(lot.id)!;
    return { lot, settings, species: species.get(lot.speciesId), ...result };
  }

  return {
    async viability(bankId: string, lotId: string, on: string) {
      const v = await lotViability(bankId, lotId);
      const ageOn = ageYears(v.harvestRef, on);
      const retestBy = v.fit ? addDays(v.harvestRef, v.fit.retestByAgeYears * YEAR_DAYS) : null;
      const projected = v.fit ? projectViability(v.fit, Math.max(0, ageOn)) : null;
      const maxAge = Math.max(ageOn, ...v.tests.map((t) => t.ageYears), 1) * 1.25;
      return {
        lotId: v.lot.id,
        on,
        ageYears: ageOn,
        initialPercent: v.fit?.initialPercent ?? null,
        sigmaYears: v.fit?.sigmaYears ?? null,
        halfLifeYears: v.fit?.halfLifeYears ?? null,
        projected,
        retestBy,
        retestReason: v.fit?.retestReason ?? null,
        basis: v.fit?.basis ?? null,
        notes: v.fit ? v.fit.notes : [v.reasonNoFit ?? 'No estimate yet.'],
        harvestReference: v.harvestRef,
        points: v.tests.map((t) => {
          const p = t.germinated / t.sown;
          return { testId: t.testId, date: t.date, ageYears: t.ageYears, percent: p * 100, germinated: t.germinated, sown: t.sown };
        }),
        curve: v.fit
          ? Array.from({ length: 41 }, (_, i) => {
              const age = (maxAge * i) / 40;
              return { ageYears: age, ...projectViability(v.fit!, age) };
            })
          : [],
      };
    },

    async seedsToSow(bankId: string, lotId: string, plants: number, on: string, assurance?: number) {
      const v = await lotViability(bankId, lotId);
      if (!v.fit) throw unprocessable(`${v.reasonNoFit ?? 'No estimate yet.'} Test the lot before working out how many seeds to sow.`);
      const projected = projectViability(v.fit, Math.max(0, ageYears(v.harvestRef, on)));
      const chosen = assurance ?? v.settings.assurance;
      const germinationUsed = (projected.percent / 100) * v.settings.establishment;
      if (germinationUsed <= 0) throw unprocessable('The projected germination is zero: no number of seeds will do.');
      const seeds = seedsToSow(plants, germinationUsed, chosen);
      return {
        seeds,
        germinationUsed,
        assurance: chosen,
        plants,
        projectedPercent: projected.percent,
        establishmentFactor: v.settings.establishment,
        basis: v.fit.basis,
        enoughStock: seeds <= v.lot.seedsOnHand,
        seedsOnHand: v.lot.seedsOnHand,
        explanation: `Sow ${seeds} seeds for ${plants} plants: the lot is projected at ${Math.round(projected.percent)}% on ${dayInWords(on)}, times ${Math.round(v.settings.establishment * 100)}% of seedlings that make a plant, with ${Math.round(chosen * 100)}% assurance of at least ${plants}.`,
      };
    },

    /**
     * The species' lots that could fill a plan entry on `on`, best first: highest projected lower
     * bound among those with enough seed, then the rest (not enough seed) after them.
     */
    async candidates(bankId: string, speciesId: string, on: string, plants: number) {
      const settings = await bankSettings(bankId);
      const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
      // Every lot of the species is fitted, as on the lot page and in the ranking (one model).
      const all = (await lotsQuery(db, bankId).where('lots.species_id', '=', speciesId).orderBy('lots.code').execute()).map(toLotDto);
      const tests = await testAggregates(db, bankId, speciesId);
      const fits = fitLots(all, tests, species, thresholdFor(settings.threshold), cache);
      const lots = all.filter((l) => l.status === 'active');
      const out = [];
      for (const lot of lots) {
        const v = fits.get(lot.id)!;
        if (!v.fit) continue;
        const projected = projectViability(v.fit, Math.max(0, ageYears(v.harvestRef, on)));
        const p = (projected.percent / 100) * settings.establishment;
        if (p <= 0) continue;
        const seeds = seedsToSow(plants, p, settings.assurance);
        out.push({ lotId: lot.id, code: lot.code, projected, seeds, seedsOnHand: lot.seedsOnHand, enough: seeds <= lot.seedsOnHand });
      }
      return out.sort((a, b) => Number(b.enough) - Number(a.enough) || b.projected.low - a.projected.low);
    },

    /**
     * Every active or depleted lot with its projection and a recommendation. Every lot of the bank
     * is fitted (a retired lot's tests still tell its species' decline), as on the lot page.
     */
    async ranking(bankId: string, on: string) {
      const settings = await bankSettings(bankId);
      const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
      const all = (await lotsQuery(db, bankId).orderBy('lots.code').execute()).map(toLotDto);
      const tests = await testAggregates(db, bankId);
      const fits = fitLots(all, tests, species, thresholdFor(settings.threshold), cache);
      const lots = all.filter((l) => l.status === 'active' || l.status === 'depleted');
      return lots.map((lot) => {
        const v = fits.get(lot.id)!;
        const sp = species.get(lot.speciesId);
        const ageOn = ageYears(v.harvestRef, on);
        const projected = v.fit ? projectViability(v.fit, Math.max(0, ageOn)) : null;
        const retestBy = v.fit ? addDays(v.harvestRef, v.fit.retestByAgeYears * YEAR_DAYS) : null;
        const last = v.lastTest;
        const decision: { recommendation: Recommendation; reason: string } = decide({
          seedsOnHand: lot.seedsOnHand,
          projected,
          hasTest: Boolean(v.fit),
          noFitReason: v.reasonNoFit,
          retestBy,
          on,
          threshold: thresholdFor(settings.threshold)(sp),
          thresholdIsStandard: sp?.traits.minGerminationPercent != null,
          establishment: settings.establishment,
        });
        return {
          lotId: lot.id,
          code: lot.code,
          speciesId: lot.speciesId,
          species: lot.speciesName,
          variety: lot.variety,
          status: lot.status,
          origin: lot.origin,
          sourceName: lot.sourceName,
          treated: lot.treated,
          ageYears: ageOn,
          lastTestDate: last?.start_date ?? null,
          lastPercent: last?.percent ?? null,
          projectedPercent: projected?.percent ?? null,
          projectedLow: projected?.low ?? null,
          projectedHigh: projected?.high ?? null,
          meanDays: last?.mean_days ?? null,
          seedsOnHand: lot.seedsOnHand,
          basis: v.fit?.basis ?? null,
          retestBy,
          thumbUrl: lot.thumbUrl,
          ...decision,
        };
      });
    },
  };
}

export type ViabilityService = ReturnType<typeof createViabilityService>;
