import type { AcceptOfferBody, CreateOfferBody } from '#shared/schemas/offers';
import { DAY_MS } from '#shared/dates';
import { hashLinkToken, newLinkToken } from '#server/auth/tokens';
import { bankToday, type Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { Insertable } from 'kysely';
import type { ReceivedTestTable, Role } from '#server/db/schema';
import { conflict, forbidden, notFound, unprocessable } from '#server/http/errors';
import type { MailQueue } from '#server/mail/mail-queue';
import type { LotsService } from '../lots/lots.service';
import { adoptSpecies } from '../species/species.shared.repository';
import type { ViabilityService } from '../viability/viability.service';
import * as repo from './offers.repository';

/** How long a link offer can be accepted: our convention, like an invitation's week but for the post. */
export const OFFER_LINK_DAYS = 30;

/** The caution shown wherever seed may cross a border (DESIGN.md, cautions); also in mails. */
export const BORDER_CAUTION =
  'Seed sent to another country or region may need a phytosanitary certificate or be barred by import or noxious-weed rules. Check the rules where the seed goes, and follow local advice.';

const canWrite = (role: Role | undefined) => role === 'grower' || role === 'owner';

/**
 * The giver's stored result as the receiver may keep it: the figures and the trays' states, not the
 * trays' ids in the giver's bank nor the words the giver wrote on setting a tray aside.
 */
export function evidenceResult(result: unknown): unknown {
  const r = result as { trayPercents?: { setAsideReason?: string | null }[] } & Record<string, unknown>;
  return {
    ...r,
    trayPercents: (r.trayPercents ?? []).map((t, i) => ({
      ...t,
      id: `tray-${i + 1}`,
      setAsideReason: t.setAsideReason ? 'Set aside by the giver' : null,
    })),
  };
}

/** A giver's finished test as a received test of the new lot (no notes, no members, no photos). */
function evidenceRow(
  t: repo.GiverTestRow,
  bankId: string,
  lotId: string,
  offerId: string,
): Insertable<ReceivedTestTable> {
  return {
    bank_id: bankId,
    lot_id: lotId,
    offer_id: offerId,
    start_date: t.start_date,
    finished_on: t.finished_on,
    method: t.method,
    medium: t.medium,
    temperature_c: t.temperature_c,
    light_hours: t.light_hours,
    pretreatment: t.pretreatment,
    trays: t.trays,
    result: JSON.stringify(evidenceResult(t.result)),
    result_sown: t.result_sown,
    result_germinated: t.result_germinated,
    result_percent: t.result_percent,
    result_mean_days: t.result_mean_days,
    result_last_count_date: t.result_last_count_date,
  };
}

/** The giver's lot as the receiver is told of it: its code, and its bank's name if the giver allows. */
export const provenanceWords = (code: string, bankName: string | null) =>
  bankName ? `Lot ${code} of ${bankName}` : `Lot ${code} of another Hilum bank`;

export interface OffersDeps {
  db: Db;
  clock: Clock;
  mailQueue: MailQueue;
  appOrigin: string;
  lots: LotsService;
  viability: ViabilityService;
}

export function createOffersService({ db, clock, mailQueue, appOrigin, lots, viability }: OffersDeps) {
  const linkOf = (offerId: string, token: string) => `${appOrigin}/offers/${offerId}?token=${token}`;

  /**
   * Who may see an offer: members of the bank it is addressed to or of the giving bank; for a link
   * offer, whoever holds the link's token. Anyone else is told it does not exist (404).
   */
  async function visibleOffer(trx: DbOrTx, offer: repo.OfferRow | undefined, userId: string, token?: string) {
    if (!offer) throw notFound('No such offer.');
    if (offer.token_hash !== null) {
      const holder = token !== undefined && hashLinkToken(token) === offer.token_hash;
      if (!holder && !(await repo.roleIn(trx, offer.from_bank_id, userId))) throw notFound('No such offer.');
      if (offer.expires_at && offer.expires_at <= clock.now() && offer.status === 'open') {
        throw conflict('This offer link has expired. Ask the giver for a new one.', 'offer_expired');
      }
      return offer;
    }
    const member =
      (await repo.roleIn(trx, offer.to_bank_id!, userId)) ??
      (await repo.roleIn(trx, offer.from_bank_id, userId));
    if (!member) throw notFound('No such offer.');
    return offer;
  }

  const closedMessage = (status: string) =>
    status === 'accepted'
      ? conflict('This offer was already accepted.', 'offer_accepted')
      : conflict(`This offer was ${status} and is closed.`, 'offer_closed');

  return {
    /** Offers part of a lot to another bank the giver belongs to, or by a link (returned once). */
    async create(bankId: string, lotId: string, userId: string, body: CreateOfferBody) {
      const lot = await repo.lotToOffer(db, bankId, lotId);
      if (!lot) throw notFound('No such lot in this bank.');
      if (body.toBankId !== undefined) {
        if (body.toBankId === bankId || !(await repo.roleIn(db, body.toBankId, userId))) {
          throw unprocessable('Offer to another bank you belong to.', {
            toBankId: 'Choose another of your banks, or make a link instead.',
          });
        }
      }
      const onHand = (await lots.get(bankId, lotId)).seedsOnHand;
      if (onHand !== null && body.seeds > onHand) {
        throw conflict(
          `Only ${onHand} seeds of ${lot.code} are on hand; offer that many or fewer.`,
          'stock_below_zero',
        );
      }
      const link = body.toBankId === undefined ? newLinkToken() : null;
      const offer = await repo.insertOffer(db, {
        from_bank_id: bankId,
        lot_id: lotId,
        seeds: body.seeds,
        to_bank_id: body.toBankId ?? null,
        token_hash: link?.hash ?? null,
        expires_at: link ? new Date(clock.now().getTime() + OFFER_LINK_DAYS * DAY_MS) : null,
        show_bank_name: body.showBankName ?? true,
        created_by: userId,
      });
      return { id: offer.id, ...(link ? { link: linkOf(offer.id, link.token) } : {}) };
    },

    /** The lot's offers with the requests for them (its page). */
    async ofLot(bankId: string, lotId: string) {
      if (!(await repo.lotToOffer(db, bankId, lotId))) throw notFound('No such lot in this bank.');
      const { offers, requests } = await repo.offersOfLot(db, bankId, lotId);
      return offers.map((o) => ({
        id: o.id,
        seeds: o.seeds,
        status: o.status,
        toBankId: o.to_bank_id,
        toBankName: o.to_bank_name,
        byLink: o.token_hash !== null,
        showBankName: o.show_bank_name,
        createdAt: o.created_at.toISOString(),
        expiresAt: o.expires_at?.toISOString() ?? null,
        requests: requests
          .filter((r) => r.offer_id === o.id)
          .map((r) => ({ id: r.id, name: r.name, note: r.note, createdAt: r.created_at.toISOString() })),
      }));
    },

    /** The giver withdraws an open offer; nothing had moved. */
    async withdraw(bankId: string, lotId: string, offerId: string) {
      const offer = await repo.findOffer(db, offerId);
      if (!offer || offer.from_bank_id !== bankId || offer.lot_id !== lotId) throw notFound('No such offer.');
      const closed = await repo.closeOpen(db, offerId, 'withdrawn', clock.now());
      if (!closed.numUpdatedRows) throw closedMessage(offer.status);
    },

    /**
     * Accepts an offer into `bankId`: in ONE transaction the seeds leave the giver's ledger, a lot
     * with them is made in the receiving bank, the giver's finished tests are copied to it as
     * read-only evidence, and the offer is closed. Any failure rolls all of it back.
     */
    async accept(offerId: string, userId: string, body: AcceptOfferBody) {
      return db.transaction().execute(async (trx) => {
        const role = await repo.roleIn(trx, body.bankId, userId);
        if (!role) throw notFound('No such bank.');
        const offer = await visibleOffer(trx, await repo.lockOffer(trx, offerId), userId, body.token);
        if (offer.to_bank_id !== null && offer.to_bank_id !== body.bankId) throw notFound('No such offer.');
        if (
          offer.token_hash !== null &&
          (body.token === undefined || hashLinkToken(body.token) !== offer.token_hash)
        ) {
          throw notFound('No such offer.');
        }
        if (!canWrite(role)) throw forbidden('Only a grower or owner of the bank can accept seed into it.');
        if (offer.status !== 'open') throw closedMessage(offer.status);
        if (offer.from_bank_id === body.bankId) {
          throw unprocessable('The seed is already in this bank: accept it into another bank.', {
            bankId: 'Choose the bank the seed goes to.',
          });
        }
        const receiverBank = (await repo.banksOf(trx, userId)).find((b) => b.id === body.bankId)!;
        // Out of the giver's ledger (the one way stock moves: refused below zero, depletes at zero).
        await lots.moveStock(trx, offer.from_bank_id, offer.lot_id, offer.created_by ?? userId, {
          change: -offer.seeds,
          kind: 'given',
          date: await bankToday(trx, clock, offer.from_bank_id),
          reason:
            offer.to_bank_id !== null
              ? `Given to ${receiverBank.name} (offer accepted)`
              : 'Given by an offer link (accepted by another bank)',
        });
        const provenance = provenanceWords(
          offer.lot_code,
          offer.show_bank_name ? offer.from_bank_name : null,
        );
        // Into the receiver's: a new lot whose first ledger line is the seeds received.
        const lotId = await lots.createIn(
          trx,
          body.bankId,
          userId,
          await bankToday(trx, clock, body.bankId),
          {
            // A species the giving bank added itself is found or copied in the receiving bank.
            speciesId: await adoptSpecies(trx, offer.species_id, body.bankId),
            variety: offer.variety,
            origin: 'swapped',
            sourceName: provenance,
            harvestDate: offer.harvest_date,
            packedForSeason: offer.packed_for_season,
            plantsBulked: offer.plants_bulked,
            treated: offer.treated,
            amount:
              offer.amount_kind === 'counted'
                ? { kind: 'counted', seeds: offer.seeds }
                : { kind: 'estimated', seeds: offer.seeds },
          },
          `Received ${offer.seeds} seeds: ${provenance}`,
        );
        const tests = await repo.finishedTestsOf(trx, offer.lot_id);
        await repo.insertReceivedTests(
          trx,
          tests.map((t) => evidenceRow(t, body.bankId, lotId, offer.id)),
        );
        await repo.markAccepted(trx, offer.id, { bankId: body.bankId, lotId, userId, now: clock.now() });
        return lots.get(body.bankId, lotId, trx);
      });
    },

    /** Declines an offer: it closes, and nothing moves. */
    async decline(offerId: string, userId: string, token?: string) {
      await db.transaction().execute(async (trx) => {
        const offer = await visibleOffer(trx, await repo.lockOffer(trx, offerId), userId, token);
        if (offer.to_bank_id !== null && !canWrite(await repo.roleIn(trx, offer.to_bank_id, userId))) {
          throw forbidden('Only a grower or owner of the bank it is offered to can decline it.');
        }
        if (offer.status !== 'open') throw closedMessage(offer.status);
        await repo.closeOpen(trx, offer.id, 'declined', clock.now());
      });
    },

    /** What the receiver sees before accepting: the lot as the giver allows, and its tests. */
    async preview(offerId: string, userId: string, token?: string) {
      const offer = await visibleOffer(db, await repo.findOffer(db, offerId), userId, token);
      const tests = (await repo.finishedTestsOf(db, offer.lot_id)).map((t, i) =>
        repo.toReceivedTestDto({ ...t, id: previewId(offer.id, i), result: t.result ?? {} }),
      );
      return {
        id: offer.id,
        status: offer.status,
        seeds: offer.seeds,
        species: offer.species_name,
        scientificName: offer.scientific_name,
        variety: offer.variety,
        harvestDate: offer.harvest_date,
        packedForSeason: offer.packed_for_season,
        treated: offer.treated,
        giverLotCode: offer.lot_code,
        giverBankName: offer.show_bank_name ? offer.from_bank_name : null,
        toBankId: offer.to_bank_id,
        tests,
      };
    },

    /** How a lot of the bank was received, with the giver's tests; null for a lot not received. */
    async received(bankId: string, lotId: string) {
      await lots.get(bankId, lotId);
      const found = await repo.receivedOf(db, bankId, lotId);
      if (!found) return null;
      return {
        offerId: found.offer.id,
        giverLotCode: found.offer.code,
        giverBankName: found.offer.show_bank_name ? found.offer.bank_name : null,
        receivedOn: (found.offer.decided_at ?? clock.now()).toISOString().slice(0, 10),
        seeds: found.offer.seeds,
        tests: found.tests.map(repo.toReceivedTestDto),
      };
    },

    /**
     * The circle's list: open offers from the banks the person belongs to and to them, each lot with
     * its latest germination and age from the giving bank's ranking (the viability service).
     */
    async circle(userId: string) {
      const rows = await repo.circleOffers(db, userId, clock.now());
      const banks = new Map((await repo.banksOf(db, userId)).map((b) => [b.id, b]));
      const rankings = new Map<
        string,
        Map<string, { ageYears: number; lastTestDate: string | null; lastPercent: number | null }>
      >();
      for (const bankId of new Set(rows.map((r) => r.from_bank_id))) {
        const on = await viability.today(bankId);
        rankings.set(bankId, new Map((await viability.ranking(bankId, on)).map((r) => [r.lotId, r])));
      }
      return rows.map((r) => {
        const ranked = rankings.get(r.from_bank_id)?.get(r.lot_id);
        const toRole = r.to_bank_id ? banks.get(r.to_bank_id)?.role : undefined;
        return {
          id: r.id,
          seeds: r.seeds,
          fromBankId: r.from_bank_id,
          fromBankName: r.from_bank_name,
          toBankId: r.to_bank_id,
          toBankName: r.to_bank_name,
          byLink: r.token_hash !== null,
          lotId: r.lot_id,
          lotCode: r.lot_code,
          species: r.species_name,
          variety: r.variety,
          treated: r.treated,
          ageYears: ranked?.ageYears ?? null,
          lastTestDate: ranked?.lastTestDate ?? null,
          lastPercent: ranked?.lastPercent ?? null,
          offeredBy: r.offered_by,
          canAccept: canWrite(toRole),
          askedByMe: r.asked_by_me,
          requests: r.requests,
          createdAt: r.created_at.toISOString(),
        };
      });
    },

    /** A member of the giving bank asks for an offered lot: a request row, and a mail to the giver. */
    async ask(offerId: string, userId: string, note: string | undefined) {
      const requestId = await db.transaction().execute(async (trx) => {
        const offer = await repo.lockOffer(trx, offerId);
        if (!offer || !(await repo.roleIn(trx, offer.from_bank_id, userId))) throw notFound('No such offer.');
        if (offer.status !== 'open') throw closedMessage(offer.status);
        if (offer.created_by === userId) throw unprocessable('This is your own offer.');
        const row = await repo.insertRequest(trx, {
          offer_id: offer.id,
          user_id: userId,
          note: note ?? null,
        });
        if (!row) throw conflict('You have already asked for this lot.', 'already_asked');
        const giver = offer.created_by ? await repo.userContact(trx, offer.created_by) : undefined;
        const asker = await repo.userContact(trx, userId);
        if (giver && asker) {
          const mailId = await mailQueue.enqueue(trx, {
            kind: 'offer_request',
            to: giver.email,
            subject: `${asker.name} asks for your lot ${offer.lot_code} on Hilum`,
            text: [
              `${asker.name} (${asker.email}), a member of “${offer.from_bank_name}”, asks for the ${offer.seeds} seeds of ${offer.species_name} “${offer.variety}” (lot ${offer.lot_code}) you offered.`,
              ...(note ? ['', `Their note: ${note}`] : []),
              '',
              `See the offer on the lot’s page: ${appOrigin}/banks/${offer.from_bank_id}/lots/${offer.lot_id}`,
              '',
              BORDER_CAUTION,
            ].join('\n'),
          });
          await repo.setRequestMail(trx, row.id, mailId);
        }
        return row.id;
      });
      mailQueue.kick();
      return { id: requestId };
    },
  };
}

/** A stable id for a test shown in a preview (the giver's own test ids stay in the giver's bank). */
function previewId(offerId: string, index: number): string {
  const hex = (index + 1).toString(16).padStart(12, '0');
  return `${offerId.slice(0, 24)}${hex}`;
}

export type OffersService = ReturnType<typeof createOffersService>;
