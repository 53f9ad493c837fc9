import { sql } from 'kysely';
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

interface TestAggregate {
  id: string;
  lot_id: string;
  start_date: string;
  status: 'running' | 'finished';
  sown: number;
  germinated: number;
  last_count_date: string | null;
  mean_days: number | null;
}

/** Every test of the bank with its pooled totals and mean germination time, in one query. */
async function testAggregates(db: Db, bankId: string, speciesId?: string): Promise<TestAggregate[]> {
  const { rows } = await sql<TestAggregate>`
    with c as (
      select tr.test_id, c.cumulative, c.check_date,
        (c.check_date - t.start_date) as day,
        c.cumulative - coalesce(lag(c.cumulative) over (partition by c.tray_id order by c.check_date), 0) as new,
        row_number() over (partition by c.tray_id order by c.check_date desc) as from_last
      from tray_counts c
      join test_trays tr on tr.id = c.tray_id
      join germination_tests t on t.id = tr.test_id
      where t.bank_id = ${bankId}
    ), counted as (
      select test_id,
        sum(cumulative) filter (where from_last = 1) as germinated,
        max(check_date) as last_count_date,
        sum(new * day)::float8 / nullif(sum(new), 0) as mean_days
      from c group by test_id
    ), sown as (
      select tr.test_id, sum(tr.seeds_sown) as sown
      from test_trays tr join germination_tests t on t.id = tr.test_id
      where t.bank_id = ${bankId}
      group by tr.test_id
    )
    select t.id, t.lot_id, t.start_date, t.status, sown.sown::int as sown,
      coalesce(counted.germinated, 0)::int as germinated, counted.last_count_date, counted.mean_days
    from germination_tests t
    join lots l on l.id = t.lot_id
    join sown on sown.test_id = t.id
    left join counted on counted.test_id = t.id
    where t.bank_id = ${bankId} ${speciesId ? sql`and l.species_id = ${speciesId}` : sql``}
    order by t.start_date`.execute(db);
  return rows;
}

/** A test counts toward the decline once finished, or once counted up to the species' final count day. */
function usable(t: TestAggregate, species: SpeciesDto | undefined): boolean {
  if (t.sown <= 0) return false;
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

/** Fits every lot of the given lists; the species' common slope is pooled once per species. */
function fitLots(
  lots: LotDto[],
  tests: TestAggregate[],
  species: Map<string, SpeciesDto>,
  thresholdFor: (s: SpeciesDto | undefined) => number,
): Map<string, LotViability> {
  const testsByLot = new Map<string, TestAggregate[]>();
  for (const t of tests) testsByLot.set(t.lot_id, [...(testsByLot.get(t.lot_id) ?? []), t]);

  const modelTests = new Map<string, LotViability['tests']>();
  for (const lot of lots) {
    const sp = species.get(lot.speciesId);
    const ref = harvestReference(lot);
    modelTests.set(
      lot.id,
      (testsByLot.get(lot.id) ?? [])
        .filter((t) => usable(t, sp))
        .map((t) => ({ ageYears: Math.max(0, ageYears(ref, t.start_date)), germinated: t.germinated, sown: t.sown, date: t.start_date, testId: t.id })),
    );
  }

  // A lot with one test says nothing about the slope, so pooling every lot of the species that was
  // tested at two or more ages gives the same common slope as pooling "the other lots".
  const slopes = new Map<string, SpeciesSlope>();
  const bySpecies = new Map<string, LotViability['tests'][]>();
  for (const lot of lots) {
    const own = modelTests.get(lot.id)!;
    if (new Set(own.map((t) => t.ageYears)).size >= 2) bySpecies.set(lot.speciesId, [...(bySpecies.get(lot.speciesId) ?? []), own]);
  }
  for (const [speciesId, groups] of bySpecies) {
    try {
      const pooled = commonSlopeProbit(groups.map((g) => ({ points: g.map((t) => ({ x: t.ageYears, successes: t.germinated, trials: t.sown })) })));
      if (pooled.converged && pooled.slope < 0 && Number.isFinite(pooled.seSlope)) slopes.set(speciesId, { slope: pooled.slope, slopeSe: pooled.seSlope });
    } catch {
      // No usable common slope for this species; lots fall back to the typical life.
    }
  }

  const out = new Map<string, LotViability>();
  for (const lot of lots) {
    const sp = species.get(lot.speciesId);
    const own = modelTests.get(lot.id)!;
    const lotTests = testsByLot.get(lot.id) ?? [];
    const lastTest = lotTests.at(-1) ?? null;
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
      reasonNoFit = lotTests.length ? 'The test is still running.' : 'No germination test yet.';
    } else {
      const life = sp?.traits.storageLifeYears;
      try {
        fit = fitViabilityDecline(
          own,
          { ...(slopes.has(lot.speciesId) ? { speciesSlope: slopes.get(lot.speciesId)! } : {}), ...(life ? { typicalLifeYears: life * factor } : {}) },
          { retestThresholdPercent: thresholdFor(sp) },
        );
        if (fit.basis === 'typical' && storageNote) fit.notes.push(storageNote);
      } catch (error) {
        reasonNoFit = `The decline cannot be estimated yet (${error instanceof Error ? error.message : 'no rate of decline known'}).`;
      }
    }
    out.set(lot.id, { fit, tests: own, lastTest, harvestRef, storageNote, reasonNoFit });
  }
  return out;
}

export function createViabilityService({ db }: { db: Db }) {
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
    const siblings = (await lotsQuery(db, bankId).where('lots.species_id', '=', lot.speciesId).execute()).map(toLotDto);
    const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
    const tests = await testAggregates(db, bankId, lot.speciesId);
    const result = fitLots(siblings, tests, species, thresholdFor(settings.threshold)).get(lot.id)!;
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
      const lots = (await lotsQuery(db, bankId).where('lots.species_id', '=', speciesId).where('lots.status', '=', 'active').execute()).map(toLotDto);
      const tests = await testAggregates(db, bankId, speciesId);
      const fits = fitLots(lots, tests, species, thresholdFor(settings.threshold));
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

    /** Every active or depleted lot with its projection and a recommendation, in four queries. */
    async ranking(bankId: string, on: string) {
      const settings = await bankSettings(bankId);
      const species = new Map((await listSpecies(db, bankId)).map((s) => [s.id, s]));
      const lots = (await lotsQuery(db, bankId).where('lots.status', 'in', ['active', 'depleted']).orderBy('lots.code').execute()).map(toLotDto);
      const tests = await testAggregates(db, bankId);
      const fits = fitLots(lots, tests, species, thresholdFor(settings.threshold));
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
          lastPercent: last && last.sown > 0 ? (last.germinated / last.sown) * 100 : null,
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
