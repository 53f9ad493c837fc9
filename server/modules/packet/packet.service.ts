import {
  HYBRID_SEED,
  POISONOUS_SEED_DEFAULT,
  SWAP_ACROSS_BORDERS,
  TREATED_SEED,
  poisonousHandling,
  type CautionWords,
} from '#shared/cautions';
import { dayInWords, monthInWords } from '#shared/day-words';
import type { SpeciesTraits } from '#shared/schemas/species';
import { LIGHT_WORDS, START_WORDS } from '#shared/sowing-words';
import { keyedLinkTokens } from '#server/auth/tokens';
import type { Db } from '#server/db/database';
import { notFound } from '#server/http/errors';
import { lotsQuery, toLotDto } from '../lots/lots.shared.repository';
import { findSpecies } from '../species/species.shared.repository';
import type { ViabilityService } from '../viability/viability.service';
import * as repo from './packet.repository';

/** What a lot's public packet page shows: nothing of the bank, its members, stock, notes or ids. */
export interface PacketContent {
  speciesName: string;
  scientificName: string | null;
  variety: string;
  /** "Harvested in 2025" or "Packed for 2026"; null when neither is known. */
  harvest: string | null;
  /** The latest test: its whole percent and the month and year it was started, in words. */
  lastTest: { percent: number; estimated: boolean; running: boolean; month: string } | null;
  /** How to sow it, one sentence each: the expected germination, how thickly, and the species' ways. */
  sowing: string[];
  cautions: CautionWords[];
}

export interface PacketDeps {
  db: Db;
  viability: ViabilityService;
  /** The server's secret: a page's token is its HMAC of the page's stored nonce. */
  secret: string;
  appOrigin: string;
}

const pct = (v: number) => `${Math.round(v)}%`;

/** The species' own ways of sowing, in words, from its traits (the species card's words). */
function speciesSowing(t: SpeciesTraits): string[] {
  const out: string[] = [];
  // The window runs from the larger number of weeks before the frost to the smaller: said fewest first.
  const weeks =
    t.startWeeksFrom !== null && t.startWeeksTo !== null
      ? t.startWeeksFrom === t.startWeeksTo
        ? `${t.startWeeksFrom}`
        : `${t.startWeeksTo}–${t.startWeeksFrom}`
      : null;
  out.push(
    `${START_WORDS[t.startMethod]}${t.startMethod !== 'direct' && weeks !== null ? `, ${weeks} weeks before the last spring frost` : ''}.`,
  );
  if (t.light) out.push(`${LIGHT_WORDS[t.light]}.`);
  if (t.germTempMinC !== null && t.germTempMaxC !== null)
    out.push(`Keep it at ${Math.round(t.germTempMinC)}–${Math.round(t.germTempMaxC)} °C to germinate.`);
  if (t.emergeDaysMin !== null && t.emergeDaysMax !== null)
    out.push(`Seedlings usually show in ${t.emergeDaysMin}–${t.emergeDaysMax} days.`);
  return out;
}

/**
 * A lot's public packet page: turned on and off by a grower, opened by anyone holding its address
 * (a label's QR code points there while it is on). The address's token is made and checked as a
 * calendar feed's is (keyedLinkTokens): only its hash is stored, and turning the page on again
 * draws a new one, so the old address answers 404.
 */
export function createPacketService({ db, viability, secret, appOrigin }: PacketDeps) {
  const { tokenOf, fresh, hashOf } = keyedLinkTokens(secret, 'hilum packet page');
  const urlOf = (nonce: string) => `${appOrigin.replace(/\/+$/, '')}/p/${tokenOf(nonce)}`;

  async function lotOf(bankId: string, lotId: string) {
    const row = await lotsQuery(db, bankId).where('lots.id', '=', lotId).executeTakeFirst();
    if (!row) throw notFound('No such lot.');
    return toLotDto(row);
  }

  async function pageOf(token: string) {
    const gone = () => notFound('No such packet page.');
    const hash = hashOf(token);
    if (!hash) throw gone();
    const page = await repo.pageByHash(db, hash);
    if (!page) throw gone();
    return page;
  }

  async function content(bankId: string, lotId: string): Promise<PacketContent> {
    const lot = await lotOf(bankId, lotId);
    const species = await findSpecies(db, bankId, lot.speciesId);
    const on = await viability.today(bankId);
    const figures = await viability.packetFigures(bankId, lotId, on);
    const sowing: string[] = [];
    if (figures.projected && !figures.estimateOnly) {
      const p = figures.projected;
      sowing.push(
        `Expected to come up on ${dayInWords(on)}: ${pct(p.percent)} (likely ${pct(p.low)}–${pct(p.high)}), from this seed's tests and its age.`,
      );
      sowing.push(figures.sowThick ?? 'Sow as usual.');
    } else {
      sowing.push(
        `No germination figure for this seed yet: sprout about ${figures.firstTestSeeds} seeds on a damp paper towel first to see how many come up.`,
      );
    }
    if (species) sowing.push(...speciesSowing(species.traits));

    const cautions: CautionWords[] = [];
    if (lot.treated) cautions.push(TREATED_SEED);
    if (species?.traits.poisonous)
      cautions.push({
        title: `Poisonous: handle ${species.commonName.toLowerCase()} seed with care`,
        text: `${species.traits.caution ?? POISONOUS_SEED_DEFAULT} ${poisonousHandling(species.traits.caution)}`,
      });
    if (await repo.savedFromHybrid(db, bankId, lotId))
      cautions.push({ title: 'Saved from a hybrid plant', text: HYBRID_SEED });
    // Seed on a packet page is seed passing between people: the usual caution for moving it.
    cautions.push(SWAP_ACROSS_BORDERS);

    const last = figures.lastTest;
    return {
      speciesName: lot.speciesName,
      scientificName: lot.scientificName,
      variety: lot.variety,
      harvest: lot.harvestDate
        ? `Harvested in ${lot.harvestDate.slice(0, 4)}`
        : lot.packedForSeason !== null
          ? `Packed for ${lot.packedForSeason}`
          : null,
      lastTest: last
        ? {
            percent: Math.round(last.percent),
            estimated: last.estimated,
            running: last.running,
            month: monthInWords(last.date),
          }
        : null,
      sowing,
      cautions,
    };
  }

  return {
    /** The lot's page address while it is on, else null (the label's QR code reads it). */
    async url(bankId: string, lotId: string): Promise<string | null> {
      const page = await repo.pageOfLot(db, bankId, lotId);
      return page ? urlOf(page.nonce) : null;
    },

    /** Turns the page on with a new address; an address made before stops answering. */
    async turnOn(bankId: string, lotId: string): Promise<string> {
      await lotOf(bankId, lotId);
      const row = fresh();
      await repo.savePage(db, { lot_id: lotId, bank_id: bankId, ...row });
      return urlOf(row.nonce);
    },

    /** Turns the page off: its address answers 404. Turning off a page already off is no error. */
    async turnOff(bankId: string, lotId: string): Promise<void> {
      await lotOf(bankId, lotId);
      await repo.deletePage(db, bankId, lotId);
    },

    /** What the page of a token shows; 404 for a token unknown, re-issued or turned off. */
    async page(token: string): Promise<PacketContent> {
      const page = await pageOf(token);
      return content(page.bank_id, page.lot_id);
    },

    /**
     * The lot a page token opens, for a member of its bank (the app's scanner reads a label whose QR
     * code holds the packet page, and opens the lot instead); 404 for anyone else, as for a bank.
     */
    async lotOf(token: string, userId: string): Promise<{ bankId: string; lotId: string }> {
      const page = await pageOf(token);
      if (!(await repo.isMember(db, page.bank_id, userId))) throw notFound('No such packet page.');
      return { bankId: page.bank_id, lotId: page.lot_id };
    },
  };
}

export type PacketService = ReturnType<typeof createPacketService>;
