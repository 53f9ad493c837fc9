import { z } from 'zod';
import { idSchema } from './common';
import { pretreatmentSchema } from './germination';

// Offers of part of a lot between banks. The paths and the names of the API are
// fixed: POST …/lots/:lotId/offers { seeds, toBankId? } → { offer: { id, link? } },
// POST /api/offers/:offerId/accept { bankId } → { lot }, POST /api/offers/:offerId/decline → 204.

/** A link offer's token as the server makes it: 32 random bytes in base64url (server/auth/tokens.ts). */
export const offerTokenSchema = z
  .string()
  .regex(/^[A-Za-z0-9_-]{43}$/, { message: 'That offer link is not complete: copy the whole link.' });

export const createOfferBodySchema = z
  .object({
    seeds: z
      .number({ message: 'Give a whole number of seeds.' })
      .int({ message: 'Give a whole number of seeds.' })
      .min(1, { message: 'Offer at least one seed.' })
      .max(10_000_000, { message: 'Offer at most 10,000,000 seeds.' }),
    /** Another bank the giver belongs to; without it the offer is a link for anyone with a Hilum bank. */
    toBankId: idSchema.optional(),
    /** Whether the receiver sees the giving bank's name beside the lot's code (default yes). */
    showBankName: z.boolean().optional(),
  })
  .strict();
export type CreateOfferBody = z.infer<typeof createOfferBodySchema>;

export const createOfferResponseSchema = z.object({
  offer: z.object({
    id: idSchema,
    /** Only for a link offer, and only now: the server keeps just a hash of its token. */
    link: z.string().optional(),
  }),
});

export const acceptOfferBodySchema = z
  .object({
    /** The bank that receives the seed; the caller must be a grower or owner there. */
    bankId: idSchema,
    /** The link's token, for an offer made by link. */
    token: offerTokenSchema.optional(),
  })
  .strict();
export type AcceptOfferBody = z.infer<typeof acceptOfferBodySchema>;

export const declineOfferBodySchema = z.object({ token: offerTokenSchema.optional() }).strict();

export const offerTokenQuerySchema = z.object({ token: offerTokenSchema.optional() });

export const offerRequestBodySchema = z
  .object({ note: z.string().trim().max(500, { message: 'Keep the note under 500 characters.' }).optional() })
  .strict();

export const offerStatusSchema = z.enum(['open', 'accepted', 'declined', 'withdrawn']);

/** A test of the giver's lot as the receiver sees it: conditions and figures, no notes, no people. */
export const receivedTestSchema = z.object({
  id: idSchema,
  startDate: z.string(),
  finishedOn: z.string().nullable(),
  method: z.string(),
  medium: z.string().nullable(),
  temperatureC: z.number().nullable(),
  lightHours: z.number().nullable(),
  pretreatment: pretreatmentSchema,
  trays: z.number(),
  sown: z.number().nullable(),
  germinated: z.number().nullable(),
  percent: z.number().nullable(),
  interval: z.object({ low: z.number(), high: z.number() }).nullable(),
  meanDays: z.number().nullable(),
});
export type ReceivedTest = z.infer<typeof receivedTestSchema>;

/** Where a received lot came from, as far as the giver allowed, and the giver's tests. */
export const receivedSchema = z.object({
  offerId: idSchema.nullable(),
  giverLotCode: z.string(),
  /** Null when the giver chose not to show the bank's name. */
  giverBankName: z.string().nullable(),
  receivedOn: z.string(),
  seeds: z.number(),
  tests: z.array(receivedTestSchema),
});
export const receivedResponseSchema = z.object({ received: receivedSchema.nullable() });

/** An offer of one of the bank's lots, as its page lists them. */
export const lotOfferSchema = z.object({
  id: idSchema,
  seeds: z.number(),
  status: offerStatusSchema,
  toBankId: idSchema.nullable(),
  toBankName: z.string().nullable(),
  byLink: z.boolean(),
  showBankName: z.boolean(),
  createdAt: z.string(),
  expiresAt: z.string().nullable(),
  requests: z.array(
    z.object({ id: idSchema, name: z.string(), note: z.string().nullable(), createdAt: z.string() }),
  ),
});
export const lotOffersResponseSchema = z.object({ items: z.array(lotOfferSchema) });

/** An open offer on the circle's list, with the lot's latest germination and age. */
export const circleOfferSchema = z.object({
  id: idSchema,
  seeds: z.number(),
  fromBankId: idSchema,
  fromBankName: z.string(),
  toBankId: idSchema.nullable(),
  toBankName: z.string().nullable(),
  byLink: z.boolean(),
  lotId: idSchema,
  lotCode: z.string(),
  species: z.string(),
  variety: z.string(),
  treated: z.boolean(),
  ageYears: z.number().nullable(),
  lastTestDate: z.string().nullable(),
  lastPercent: z.number().nullable(),
  offeredBy: z.string().nullable(),
  /** The caller may accept it into this bank: a grower or owner of the bank it is addressed to. */
  canAccept: z.boolean(),
  askedByMe: z.boolean(),
  requests: z.number(),
  createdAt: z.string(),
});
export type CircleOffer = z.infer<typeof circleOfferSchema>;
export const circleOffersResponseSchema = z.object({ items: z.array(circleOfferSchema) });

/** An offer as its receiver sees it before accepting (the link page). */
export const offerPreviewSchema = z.object({
  id: idSchema,
  status: offerStatusSchema,
  seeds: z.number(),
  species: z.string(),
  scientificName: z.string(),
  variety: z.string(),
  harvestDate: z.string().nullable(),
  packedForSeason: z.number().nullable(),
  treated: z.boolean(),
  giverLotCode: z.string(),
  giverBankName: z.string().nullable(),
  toBankId: idSchema.nullable(),
  tests: z.array(receivedTestSchema),
});
export const offerPreviewResponseSchema = z.object({ offer: offerPreviewSchema });

export const offerRequestResponseSchema = z.object({ request: z.object({ id: idSchema }) });
