import { z } from 'zod';
import {
  loginBodySchema,
  meResponseSchema,
  passwordResetBodySchema,
  passwordResetConfirmBodySchema,
  registerBodySchema,
  userSchema,
  verifyEmailBodySchema,
} from '#shared/schemas/accounts';
import {
  acceptInvitationBodySchema,
  acceptInvitationResponseSchema,
  bankResponseSchema,
  bankUpdateResponseSchema,
  bankSchema,
  createBankBodySchema,
  createInvitationBodySchema,
  invitationSchema,
  invitationsResponseSchema,
  membersResponseSchema,
  updateBankBodySchema,
  updateMemberBodySchema,
} from '#shared/schemas/banks';
import { calendarFeedSchema } from '#shared/schemas/calendar';
// Packet pages
import {
  labelQuerySchema,
  packetLotSchema,
  packetPageBodySchema,
  packetPageSchema,
  packetPageStateSchema,
} from '#shared/schemas/packet';
import { growOutResponseSchema, keepingTrueResponseSchema } from '#shared/schemas/seed-saving';
import { csvImportQuerySchema, errorResponseSchema, onQuerySchema } from '#shared/schemas/common';
import {
  assayDetailQuerySchema,
  countsBodySchema,
  createAssayBodySchema,
  finishBodySchema,
  assayDetailSchema,
  assaySetAsideBodySchema,
  assaysImportPreviewSchema,
  trayUpdateBodySchema,
  updateAssayBodySchema,
} from '#shared/schemas/germination';
import {
  createLotBodySchema,
  createPlantBodySchema,
  lotSchema,
  lotsImportPreviewSchema,
  lotsListQuerySchema,
  movementSchema,
  parentPlantSchema,
  plantsFromSowingBodySchema,
  photoSchema,
  photoSizeQuerySchema,
  seedWeightBodySchema,
  seedWeightSchema,
  stockBodySchema,
  updateLotBodySchema,
  updatePlantBodySchema,
} from '#shared/schemas/lots';
import { overviewSchema } from '#shared/schemas/overview';
import {
  createPlanBodySchema,
  emergenceBodySchema,
  emergenceResponseSchema,
  createPlanResponseSchema,
  planEntrySchema,
  planListResponseSchema,
  seasonQuerySchema,
  sownBodySchema,
  updatePlanBodySchema,
} from '#shared/schemas/plan';
import { reminderPrefsBodySchema, reminderPrefsSchema } from '#shared/schemas/reminders';
import {
  createSpaceBodySchema,
  spaceEnvelopeSchema,
  spaceListResponseSchema,
  spacePlanResponseSchema,
  updateSpaceBodySchema,
} from '#shared/schemas/spaces';
import {
  createSpeciesBodySchema,
  overrideTraitsBodySchema,
  speciesListResponseSchema,
  speciesSchema,
} from '#shared/schemas/species';
import {
  rankingResponseSchema,
  seedsToSowQuerySchema,
  seedsToSowResponseSchema,
  viabilityResponseSchema,
} from '#shared/schemas/viability';

// Offers between banks.
import {
  acceptOfferBodySchema,
  circleOffersResponseSchema,
  createOfferBodySchema,
  createOfferResponseSchema,
  declineOfferBodySchema,
  lotOffersResponseSchema,
  offerPreviewResponseSchema,
  offerRequestBodySchema,
  offerRequestResponseSchema,
  offerTokenQuerySchema,
  receivedResponseSchema,
} from '#shared/schemas/offers';
/**
 * The API's one route table: every route mounted under /api, with the zod schemas its router parses
 * (`parse(schema, req.body | req.query)`) and sends (`respond(res, status, schema, body)`). The
 * OpenAPI document (document.ts) is generated from it, and tests/api/openapi.test.ts walks the
 * app's Express router stack and fails when a mounted route is missing here. Adding a route: add
 * its entry beside its module's others, with the same schemas the router uses.
 *
 * Queries come from shared/schemas, the same objects the routers parse. A few envelopes (`{ lot }`,
 * `{ items, nextCursor }`) are declared inside their routers; they are written again here from the
 * same shared schemas until the routers import them from shared/schemas.
 */

export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
/** Who may call a route: anyone, any signed-in person, or a member of the bank with at least this role. */
export type Access = 'public' | 'signed-in' | 'viewer' | 'grower' | 'owner';

export interface ApiResponse {
  status: number;
  description: string;
  /** The JSON body's schema; none for an empty body or a file. */
  json?: z.ZodType;
  /** A non-JSON body: its media type. */
  file?: string;
}

export interface ApiRoute {
  method: Method;
  /** The full path as Express mounts it, with `:param` segments. */
  path: string;
  summary: string;
  access: Access;
  query?: z.ZodObject;
  /** A JSON request body. */
  body?: z.ZodType;
  /** A multipart/form-data upload: the name of its one file field and its media type. */
  upload?: { field: string; accept: string };
  responses: ApiResponse[];
  /** Mounted outside production only. */
  devOnly?: boolean;
}

const ok = (json: z.ZodType, description = 'OK.'): ApiResponse => ({ status: 200, description, json });
const created = (json: z.ZodType, description = 'Created.'): ApiResponse => ({
  status: 201,
  description,
  json,
});
const noContent = (description = 'Done; no body.'): ApiResponse => ({ status: 204, description });
/** The routes limited in server/http/rate-limit.ts (authRateLimits): counted in PostgreSQL, shared by every server. */
const limited = (what: string): ApiResponse => ({
  status: 429,
  description: `Too many attempts (${what}); the message says when to try again. Error code rate_limited.`,
  json: errorResponseSchema,
});
const file = (type: string, description: string): ApiResponse => ({ status: 200, description, file: type });

// Envelopes written inside the routers (see above).
const userEnvelope = z.object({ user: userSchema });
const lotEnvelope = z.object({ lot: lotSchema });
const plantEnvelope = z.object({ plant: parentPlantSchema });
const photoEnvelope = z.object({ photo: photoSchema });
const speciesEnvelope = z.object({ species: speciesSchema });
const entryEnvelope = z.object({ entry: planEntrySchema });
const preferencesEnvelope = z.object({ preferences: reminderPrefsSchema });
const csvUpload = { field: 'file', accept: 'text/csv' };

// Bodies their routers send without a schema; documented here from the handler's code (the lots
// import preview is the schema the client reads it with).
const healthSchema = z.object({
  ok: z.boolean(),
  database: z.enum(['up', 'down']),
  objectStore: z.enum(['up', 'down']),
  mail: z.enum(['up', 'down']),
  environment: z.string(),
});
const lotsImportSchema = z.union([lotsImportPreviewSchema, z.object({ imported: z.number() })]);

const BANK = '/api/banks/:bankId';

// Offers between banks (server/modules/offers).
const offerRoutes: ApiRoute[] = [
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/offers`,
    summary: 'The lot’s offers to other banks, newest first, with who asked for each.',
    access: 'viewer',
    responses: [ok(lotOffersResponseSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/lots/:lotId/offers`,
    summary:
      'Offer part of the lot to another bank the caller belongs to (`toBankId`), or, without it, by a link (`link`, returned only now: the server keeps a hash of its token; it works for 30 days). `seeds` above the seeds on hand → 409 `stock_below_zero`; a bank the caller is not in → 422. Nothing moves until the offer is accepted.',
    access: 'grower',
    body: createOfferBodySchema,
    responses: [created(createOfferResponseSchema)],
  },
  {
    method: 'delete',
    path: `${BANK}/lots/:lotId/offers/:offerId`,
    summary: 'Withdraw an open offer (409 when it is already closed). Nothing had moved.',
    access: 'grower',
    responses: [noContent()],
  },
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/received`,
    summary:
      'How the lot came by an accepted offer (the giver’s lot code, and bank name if the giver allowed) and the giver’s finished tests, read-only evidence that the lot’s viability and decision use as its tests; `received` is null for a lot not received.',
    access: 'viewer',
    responses: [ok(receivedResponseSchema)],
  },
  {
    method: 'get',
    path: '/api/offers',
    summary:
      'The circle’s list: open offers from and to the banks the caller belongs to, each lot with its latest germination and age (from the giving bank’s ranking).',
    access: 'signed-in',
    responses: [ok(circleOffersResponseSchema)],
  },
  {
    method: 'get',
    path: '/api/offers/:offerId',
    summary:
      'An offer as the receiver sees it before accepting (with `token` for a link offer); 404 to anyone else.',
    access: 'signed-in',
    query: offerTokenQuerySchema,
    responses: [ok(offerPreviewResponseSchema)],
  },
  {
    method: 'post',
    path: '/api/offers/:offerId/accept',
    summary:
      'Accept into `bankId` (the caller a grower or owner there; with `token` for a link offer). In one transaction the seeds leave the giver’s ledger, a lot with them is made in the receiving bank, and the giver’s finished tests are copied to it. Accepted or closed already → 409; not the addressed bank, or no such offer → 404; a viewer → 403.',
    access: 'signed-in',
    body: acceptOfferBodySchema,
    responses: [created(lotEnvelope)],
  },
  {
    method: 'post',
    path: '/api/offers/:offerId/decline',
    summary:
      'Decline an offer (a grower or owner of the bank it is addressed to, or the link’s holder): it closes and nothing moves.',
    access: 'signed-in',
    body: declineOfferBodySchema,
    responses: [noContent()],
  },
  {
    method: 'post',
    path: '/api/offers/:offerId/requests',
    summary:
      'Ask for an offered lot (a member of the giving bank): the giver sees the request on the lot and gets a mail. Asked already → 409.',
    access: 'signed-in',
    body: offerRequestBodySchema,
    responses: [created(offerRequestResponseSchema)],
  },
];

export const apiRoutes: ApiRoute[] = [
  // Service
  {
    method: 'get',
    path: '/api/health',
    summary: 'Whether the database, object store and mail server answer (503 when one does not).',
    access: 'public',
    responses: [
      ok(healthSchema),
      { status: 503, description: 'A backing service is down.', json: healthSchema },
    ],
  },
  {
    method: 'get',
    path: '/api/openapi.json',
    summary: 'This document.',
    access: 'public',
    responses: [
      { status: 200, description: 'The OpenAPI document.', json: z.record(z.string(), z.unknown()) },
    ],
  },
  {
    method: 'get',
    path: '/api/docs',
    summary: 'This document as a page to read.',
    access: 'public',
    devOnly: true,
    responses: [file('text/html', 'The document as HTML.')],
  },

  // Accounts
  {
    method: 'post',
    path: '/api/auth/register',
    summary: 'Sign up; sets the session cookie and mails a link to confirm the e-mail address.',
    access: 'public',
    body: registerBodySchema,
    responses: [created(userEnvelope), limited('100 sign-ups an hour per address')],
  },
  {
    method: 'post',
    path: '/api/auth/login',
    summary:
      'Sign in; sets the session cookie. Failures are limited per account and address together, so failures from elsewhere never lock the owner out.',
    access: 'public',
    body: loginBodySchema,
    responses: [
      ok(userEnvelope),
      limited('5 failed sign-ins in 15 minutes per account and address, 50 per address'),
    ],
  },
  {
    method: 'post',
    path: '/api/auth/logout',
    summary: 'Sign out of this session.',
    access: 'public',
    responses: [noContent()],
  },
  {
    method: 'post',
    path: '/api/auth/logout-all',
    summary: 'Sign out of every session.',
    access: 'signed-in',
    responses: [noContent()],
  },
  {
    method: 'post',
    path: '/api/auth/password-reset',
    summary:
      'Queue a reset link for the address if it has an account: the same answer, in the same time, either way; the mail is sent and retried from the mail queue.',
    access: 'public',
    body: passwordResetBodySchema,
    responses: [
      { status: 202, description: 'Accepted.', json: z.object({ ok: z.literal(true) }) },
      limited('20 an hour per address, 3 an hour per e-mail'),
    ],
  },
  {
    method: 'post',
    path: '/api/auth/password-reset/confirm',
    summary:
      'Set a new password with a reset token (checked before any password is hashed); ends every session and every other reset link.',
    access: 'public',
    body: passwordResetConfirmBodySchema,
    responses: [noContent(), limited('20 in 15 minutes per address')],
  },
  {
    method: 'post',
    path: '/api/auth/verify-email',
    summary: 'Confirm the account’s e-mail address with the token from the mailed link.',
    access: 'public',
    body: verifyEmailBodySchema,
    responses: [ok(userEnvelope)],
  },
  {
    method: 'post',
    path: '/api/auth/verify-email/resend',
    summary: 'Mail a new confirmation link to the signed-in account (409 when already confirmed).',
    access: 'signed-in',
    responses: [{ status: 202, description: 'Queued.', json: z.object({ ok: z.literal(true) }) }],
  },
  {
    method: 'get',
    path: '/api/me',
    summary: 'The signed-in person and their banks.',
    access: 'signed-in',
    responses: [ok(meResponseSchema)],
  },
  {
    method: 'post',
    path: '/api/invitations/accept',
    summary: 'Join a bank with an invitation token.',
    access: 'signed-in',
    body: acceptInvitationBodySchema,
    responses: [ok(acceptInvitationResponseSchema)],
  },
  {
    method: 'get',
    path: '/api/photos/:photoId',
    summary: 'A photo file (WebP), to members of its bank.',
    access: 'signed-in',
    query: photoSizeQuerySchema,
    responses: [file('image/webp', 'The photo.'), { status: 304, description: 'Not modified (ETag).' }],
  },

  // Banks, members, invitations
  {
    method: 'post',
    path: '/api/banks',
    summary: 'Start a bank; the caller becomes its owner.',
    access: 'signed-in',
    body: createBankBodySchema,
    responses: [created(z.object({ bank: bankSchema }))],
  },
  {
    method: 'get',
    path: BANK,
    summary: 'The bank and the caller’s role in it.',
    access: 'viewer',
    responses: [ok(bankResponseSchema)],
  },
  {
    method: 'patch',
    path: BANK,
    summary:
      'Change the bank’s settings. `planMoved` says, per coming season, how many unsown sowings a changed last frost moved and by how many days (sown ones keep their dates).',
    access: 'owner',
    body: updateBankBodySchema,
    responses: [ok(bankUpdateResponseSchema)],
  },
  {
    method: 'delete',
    path: BANK,
    summary: 'Delete the bank and everything in it.',
    access: 'owner',
    responses: [noContent()],
  },
  {
    method: 'get',
    path: `${BANK}/members`,
    summary: 'The bank’s members.',
    access: 'viewer',
    responses: [ok(membersResponseSchema)],
  },
  {
    method: 'patch',
    path: `${BANK}/members/:userId`,
    summary: 'Change a member’s role.',
    access: 'owner',
    body: updateMemberBodySchema,
    responses: [ok(membersResponseSchema)],
  },
  {
    method: 'delete',
    path: `${BANK}/members/:userId`,
    summary: 'Remove a member.',
    access: 'owner',
    responses: [noContent()],
  },
  {
    method: 'post',
    path: `${BANK}/leave`,
    summary: 'Leave the bank.',
    access: 'viewer',
    responses: [noContent()],
  },
  {
    method: 'get',
    path: `${BANK}/invitations`,
    summary: 'Open invitations.',
    access: 'owner',
    responses: [ok(invitationsResponseSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/invitations`,
    summary: 'Invite someone by e-mail.',
    access: 'owner',
    body: createInvitationBodySchema,
    responses: [created(z.object({ invitation: invitationSchema }))],
  },
  {
    method: 'post',
    path: `${BANK}/invitations/:invitationId/resend`,
    summary: 'Mail an open invitation again with a new link (the earlier link stops working).',
    access: 'owner',
    responses: [ok(z.object({ invitation: invitationSchema }))],
  },
  {
    method: 'delete',
    path: `${BANK}/invitations/:invitationId`,
    summary: 'Revoke an invitation.',
    access: 'owner',
    responses: [noContent()],
  },
  {
    method: 'get',
    path: `${BANK}/reminders`,
    summary:
      'The caller’s reminder choices in this bank: each kind on or off, and the hour (0–23, on the bank’s clock; 7 unless chosen) they go out from. Tray check-day reminders go only to the member running the test, and not once that day’s counts are saved.',
    access: 'viewer',
    responses: [ok(preferencesEnvelope)],
  },
  {
    method: 'patch',
    path: `${BANK}/reminders`,
    summary: 'Change the caller’s reminder choices and hour (`hour`: a whole number 0–23, else 400).',
    access: 'viewer',
    body: reminderPrefsBodySchema,
    responses: [ok(preferencesEnvelope)],
  },
  {
    method: 'get',
    path: `${BANK}/calendar-feed`,
    summary: 'The caller’s private calendar feed address for this bank, made on first use.',
    access: 'viewer',
    responses: [ok(calendarFeedSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/calendar-feed/rotate`,
    summary: 'A new private calendar feed address; the old one then answers 404.',
    access: 'viewer',
    responses: [ok(calendarFeedSchema)],
  },
  {
    method: 'get',
    path: '/api/calendar/:token.ics',
    summary:
      'A member’s calendar feed (the plan and the tests’ check days) for calendar apps; the token in the address is the key, no cookie. Unknown, rotated or former members’ tokens answer 404.',
    access: 'public',
    responses: [
      file('text/calendar', 'The calendar.'),
      { status: 404, description: 'No such feed.', json: errorResponseSchema },
    ],
  },
  {
    method: 'get',
    path: `${BANK}/overview`,
    summary: 'What needs doing this week (from the bank’s today, or `on`).',
    access: 'viewer',
    query: onQuerySchema,
    responses: [ok(overviewSchema)],
  },

  // Species
  {
    method: 'get',
    path: `${BANK}/species`,
    summary: 'The reference species and the bank’s own.',
    access: 'viewer',
    responses: [ok(speciesListResponseSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/species`,
    summary: 'Add a species of the bank’s own.',
    access: 'grower',
    body: createSpeciesBodySchema,
    responses: [created(speciesEnvelope)],
  },
  {
    method: 'patch',
    path: `${BANK}/species/:speciesId`,
    summary: 'Override a species’ traits for this bank.',
    access: 'grower',
    body: overrideTraitsBodySchema,
    responses: [ok(speciesEnvelope)],
  },
  {
    method: 'delete',
    path: `${BANK}/species/:speciesId/overrides`,
    summary: 'Go back to the reference traits.',
    access: 'grower',
    responses: [ok(speciesEnvelope)],
  },

  // Lots
  {
    method: 'get',
    path: `${BANK}/lots`,
    summary: 'Lots, a page at a time.',
    access: 'viewer',
    query: lotsListQuerySchema,
    responses: [ok(z.object({ items: z.array(lotSchema), nextCursor: z.string().nullable() }))],
  },
  {
    method: 'post',
    path: `${BANK}/lots`,
    summary: 'Log a lot.',
    access: 'grower',
    body: createLotBodySchema,
    responses: [created(lotEnvelope)],
  },
  {
    method: 'post',
    path: `${BANK}/lots/import`,
    summary: 'Import lots from CSV, all or nothing (`dryRun=true` only shows what it would add).',
    access: 'grower',
    query: csvImportQuerySchema,
    upload: csvUpload,
    responses: [ok(lotsImportSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/lots.csv`,
    summary: 'Every lot as CSV.',
    access: 'viewer',
    responses: [file('text/csv', 'The lots.')],
  },
  {
    method: 'get',
    path: `${BANK}/lots/:lotId`,
    summary:
      'One lot, with its `lineage` (generation, population, parent plants, the earlier lots of its line). A lot with no parent plant grown from a lot of this bank is generation 1.',
    access: 'viewer',
    responses: [ok(lotEnvelope)],
  },
  {
    method: 'patch',
    path: `${BANK}/lots/:lotId`,
    summary:
      'Change a lot. 409 `lineage_cycle` (field parentPlantIds) when a parent plant grew from this lot or from a lot saved from it: a lot cannot be its own ancestor.',
    access: 'grower',
    body: updateLotBodySchema,
    responses: [ok(lotEnvelope)],
  },
  {
    method: 'delete',
    path: `${BANK}/lots/:lotId`,
    summary: 'Delete a lot, or retire it when it has tests.',
    access: 'grower',
    responses: [
      noContent('Deleted.'),
      ok(z.object({ lot: lotSchema, retired: z.literal(true) }), 'Retired: the lot has tests.'),
    ],
  },
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/stock`,
    summary: 'The lot’s stock ledger.',
    access: 'viewer',
    responses: [
      ok(
        z.object({
          items: z.array(movementSchema),
          seedsOnHand: z.number().nullable().describe('Null while the lot’s amount is not known.'),
        }),
      ),
    ],
  },
  {
    method: 'post',
    path: `${BANK}/lots/:lotId/stock`,
    summary: 'Record a stock movement.',
    access: 'grower',
    body: stockBodySchema,
    responses: [
      created(
        z.object({
          movement: movementSchema,
          seedsOnHand: z
            .number()
            .nullable()
            .describe(
              'Null when the lot’s amount is not known: the movement is recorded, the amount stays unknown.',
            ),
        }),
      ),
    ],
  },
  {
    method: 'post',
    path: `${BANK}/lots/:lotId/seed-weights`,
    summary:
      'Record a weighed sample of the lot: seeds counted, their weight in grams, and optionally their weight once the chaff is picked out. The lot’s seeds per gram (thousand-seed weight, as ISTA Rules ch. 10 weighs 8 replicates of 100 seeds; fewer are accepted, with the spread stated) and its pure-seed fraction come from all its samples; a weighed amount is turned into seeds again with them.',
    access: 'grower',
    body: seedWeightBodySchema,
    responses: [created(z.object({ seedWeight: seedWeightSchema }))],
  },
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/label.svg`,
    summary:
      'The lot’s packet label with a QR code: it opens the lot’s public packet page while that is on, else the lot in the app. `for=giving` draws a packet for giving seed away, with the germination and the month and year of its test.',
    access: 'viewer',
    query: labelQuerySchema,
    responses: [file('image/svg+xml', 'The label.')],
  },
  // Packet pages
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/packet-page`,
    summary: 'Whether the lot’s public packet page is on, and its address (`url`, null when off).',
    access: 'viewer',
    responses: [ok(packetPageStateSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/lots/:lotId/packet-page`,
    summary:
      'Turns the lot’s public packet page on, with a new long random address; an address made before then answers 404. ' +
      'The page itself is `GET /p/:token` (outside /api, HTML, no sign-in, noindex): species, variety, harvest year, the latest test’s germination with its month and year, sowing advice and cautions — no notes, member names, stock, lot code or ids. ' +
      'It answers 404 once the page is turned off or re-issued. No body, or an empty JSON object.',
    access: 'grower',
    body: packetPageBodySchema,
    responses: [created(packetPageSchema)],
  },
  {
    method: 'delete',
    path: `${BANK}/lots/:lotId/packet-page`,
    summary: 'Turns the lot’s public packet page off: its address answers 404. Already off is no error.',
    access: 'grower',
    responses: [noContent()],
  },
  {
    method: 'get',
    path: '/api/packet-pages/:token',
    summary:
      'The lot a packet page address opens (its token), for a signed-in member of the lot’s bank: the app’s scanner opens the lot from a label whose QR code holds the packet page. 404 for anyone else, and once the page is off or re-issued.',
    access: 'signed-in',
    responses: [
      ok(packetLotSchema),
      { status: 404, description: 'No such page, or not a member.', json: errorResponseSchema },
    ],
  },
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/viability`,
    summary: 'The lot’s viability on a date (the bank’s today unless `on`).',
    access: 'viewer',
    query: onQuerySchema,
    responses: [ok(viabilityResponseSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/seeds-to-sow`,
    summary: 'Seeds to sow for a number of plants at an assurance.',
    access: 'viewer',
    query: seedsToSowQuerySchema,
    responses: [ok(seedsToSowResponseSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/ranking`,
    summary: 'Every lot ranked with its advice (rows rendered through the row schema).',
    access: 'viewer',
    query: onQuerySchema,
    responses: [ok(rankingResponseSchema)],
  },

  // Germination tests
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/tests`,
    summary: 'The lot’s germination tests.',
    access: 'viewer',
    responses: [ok(z.object({ items: z.array(assayDetailSchema), nextCursor: z.null() }))],
  },
  {
    method: 'post',
    path: `${BANK}/lots/:lotId/tests`,
    summary:
      'Start a germination test; each tray sown by count, by weight (grams) or by a rough guess (`sown`), or `{ seedsSown }`.',
    access: 'grower',
    body: createAssayBodySchema,
    responses: [created(assayDetailSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/tests/:testId`,
    summary: 'A germination test with its result.',
    access: 'viewer',
    query: assayDetailQuerySchema,
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'patch',
    path: `${BANK}/tests/:testId`,
    summary:
      'Change a running germination test; `runnerId` hands it to another owner or grower of the bank (422 for a viewer or a non-member), whom its check-day reminders then go to.',
    access: 'grower',
    body: updateAssayBodySchema,
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'delete',
    path: `${BANK}/tests/:testId`,
    summary: 'Delete a germination test.',
    access: 'grower',
    responses: [noContent()],
  },
  {
    method: 'post',
    path: `${BANK}/tests/:testId/counts`,
    summary: 'Record one check day’s counts: each tray counted (`cumulative`) or scored roughly (`score`).',
    access: 'grower',
    body: countsBodySchema,
    responses: [created(assayDetailSchema)],
  },
  {
    method: 'delete',
    path: `${BANK}/tests/:testId/counts/:date`,
    summary: 'Remove one check day’s counts and rough scores.',
    access: 'grower',
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/tests/:testId/finish`,
    summary: 'Finish the test with abnormal and ungerminated seeds.',
    access: 'grower',
    body: finishBodySchema,
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'patch',
    path: `${BANK}/tests/:testId/trays/:trayId`,
    summary: 'Set a tray aside, or bring it back.',
    access: 'grower',
    body: trayUpdateBodySchema,
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/tests/:testId/set-aside`,
    summary: 'Set the whole test aside, or bring it back.',
    access: 'grower',
    body: assaySetAsideBodySchema,
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/tests/:testId/reopen`,
    summary: 'Reopen a finished test.',
    access: 'grower',
    responses: [ok(assayDetailSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/tests/import`,
    summary:
      'Import past germination tests from CSV, all or nothing (`dryRun=true` only shows what it would add).',
    access: 'grower',
    query: csvImportQuerySchema,
    upload: csvUpload,
    responses: [ok(z.union([assaysImportPreviewSchema, z.object({ imported: z.number() })]))],
  },
  {
    method: 'get',
    path: `${BANK}/tests.csv`,
    summary: 'Every germination test as CSV, one record per tray and check day.',
    access: 'viewer',
    responses: [file('text/csv', 'The tests.')],
  },

  // Photos
  ...(['lots/:lotId', 'plants/:plantId', 'tests/:testId/trays/:trayId'] as const).flatMap(
    (subject): ApiRoute[] => [
      {
        method: 'get',
        path: `${BANK}/${subject}/photos`,
        summary: 'The subject’s photos.',
        access: 'viewer',
        responses: [ok(z.object({ items: z.array(photoSchema) }))],
      },
      {
        method: 'post',
        path: `${BANK}/${subject}/photos`,
        summary: 'Upload a photo (checked, turned upright, stripped of location data).',
        access: 'grower',
        upload: { field: 'photo', accept: 'image/*' },
        responses: [created(photoEnvelope)],
      },
    ],
  ),
  {
    method: 'delete',
    path: `${BANK}/photos/:photoId`,
    summary: 'Delete a photo.',
    access: 'grower',
    responses: [noContent()],
  },

  // Parent plants
  {
    method: 'get',
    path: `${BANK}/plants`,
    summary: 'The bank’s parent plants.',
    access: 'viewer',
    responses: [ok(z.object({ items: z.array(parentPlantSchema), nextCursor: z.null() }))],
  },
  {
    method: 'post',
    path: `${BANK}/plants`,
    summary: 'Add a parent plant.',
    access: 'grower',
    body: createPlantBodySchema,
    responses: [created(plantEnvelope)],
  },
  {
    method: 'get',
    path: `${BANK}/plants/:plantId`,
    summary: 'One parent plant.',
    access: 'viewer',
    responses: [ok(plantEnvelope)],
  },
  {
    method: 'patch',
    path: `${BANK}/plants/:plantId`,
    summary: 'Change a parent plant.',
    access: 'grower',
    body: updatePlantBodySchema,
    responses: [ok(plantEnvelope)],
  },
  {
    method: 'delete',
    path: `${BANK}/plants/:plantId`,
    summary: 'Delete a parent plant.',
    access: 'grower',
    responses: [noContent()],
  },
  // Generations
  {
    method: 'post',
    path: `${BANK}/plants/from-sowing`,
    summary:
      'Keep plants for seed from a sown plan entry: `plants` parent plants, one each (labelled “<label>, plant i of n”; label defaults to “From <lot code>”), of the entry’s species and season, the variety of its lot, and `grownFromLotId` its lot, written in one transaction. 404 when the entry is not of this bank; 422 (field entryId) when it is not sown yet or names no lot.',
    access: 'grower',
    body: plantsFromSowingBodySchema,
    responses: [created(z.object({ items: z.array(parentPlantSchema) }))],
  },

  // Plan
  {
    method: 'get',
    path: `${BANK}/plan`,
    summary:
      'The season’s plan (the coming season unless `season`). An unsown entry’s dates are worked out on every read from the bank’s frost date and margin and the species (its hardiness: plant-out and outside sowing relative to the last frost; its days to emerge); a sown entry keeps the dates it was sown under. `moved` is the latest frost-date move of the season, in words.',
    access: 'viewer',
    query: seasonQuerySchema,
    responses: [ok(planListResponseSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/plan`,
    summary:
      'Plan a sowing, or with `succession: { sowings, everyWeeks }` a succession of them (2–12 sowings, 1–8 weeks apart): each sowing is an entry of its own, `everyWeeks` weeks after the one before, with its own dates, lot and seeds, marked sown on its own. `entry` is the first sowing, `entries` every one made.',
    access: 'grower',
    body: createPlanBodySchema,
    responses: [created(createPlanResponseSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/plan/:entryId`,
    summary: 'One plan entry.',
    access: 'viewer',
    responses: [ok(entryEnvelope)],
  },
  {
    method: 'patch',
    path: `${BANK}/plan/:entryId`,
    summary: 'Change a plan entry.',
    access: 'grower',
    body: updatePlanBodySchema,
    responses: [ok(entryEnvelope)],
  },
  {
    method: 'delete',
    path: `${BANK}/plan/:entryId`,
    summary: 'Delete a plan entry.',
    access: 'grower',
    responses: [noContent()],
  },
  {
    method: 'post',
    path: `${BANK}/plan/:entryId/sown`,
    summary:
      'Mark sown on `date` (required: no default day); takes the seeds from the lot’s ledger and keeps the dates it was sown under, seedlings expected from that day. A date outside the sowing window answers 409 `outside_window` (the window in words) unless `confirm: true`; a date after the bank’s today is 422; 409 `already_sown`, or `stock_below_zero` when the lot is short.',
    access: 'grower',
    body: sownBodySchema,
    responses: [ok(entryEnvelope)],
  },
  {
    method: 'post',
    path: `${BANK}/plan/:entryId/emergence`,
    summary:
      'Record what came up from a sowing: `seedlings` counted or a rough `score` (exactly one), by `date` (from the sowing day to today). Every record is kept; the latest of a sowing (by date, then by when written) is what came up, and the lot’s viability reads it as field emergence, weaker evidence than a test. 409 `not_sown` unless the entry is marked sown; 422 for a date before the sowing or in the future, or more seedlings than seeds sown.',
    access: 'grower',
    body: emergenceBodySchema,
    responses: [created(emergenceResponseSchema, 'Recorded: the entry with every record, and the new one.')],
  },
  {
    method: 'delete',
    path: `${BANK}/plan/:entryId/sown`,
    summary: 'Undo sown; puts the seeds back (what was recorded as coming up from it goes too).',
    access: 'grower',
    responses: [ok(entryEnvelope)],
  },
  {
    method: 'get',
    path: `${BANK}/plan.ics`,
    summary: 'The season’s plan and retests as an iCalendar file.',
    access: 'viewer',
    query: seasonQuerySchema,
    responses: [file('text/calendar', 'The calendar.')],
  },

  // Growing spaces (room under the lights)
  {
    method: 'get',
    path: `${BANK}/plan/space`,
    summary:
      'The season’s room under the lights (the coming season unless `season`), week by week, in cells (a tray is `cellsPerTray` cells): each indoor sowing takes one cell a seed from its sowing day (sown, else the first day of its window), then plants wanted × the species’ cells per plant from potting up (sowing + its weeks to potting up) until it goes out to harden off. Weeks start on Monday on the bank’s calendar; a week’s `used` is the most cells in use on a day of it, and `overflow` is used > capacity (the sum of the spaces).',
    access: 'viewer',
    query: seasonQuerySchema,
    responses: [ok(spacePlanResponseSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/spaces`,
    summary: 'The bank’s growing spaces: shelves or boxes under lights and how many trays or cells fit.',
    access: 'viewer',
    responses: [ok(spaceListResponseSchema)],
  },
  {
    method: 'post',
    path: `${BANK}/spaces`,
    summary: 'Add a growing space. 409 `duplicate_space` when the bank has one of that name.',
    access: 'grower',
    body: createSpaceBodySchema,
    responses: [created(spaceEnvelopeSchema)],
  },
  {
    method: 'patch',
    path: `${BANK}/spaces/:spaceId`,
    summary: 'Change a growing space’s name, capacity or unit.',
    access: 'grower',
    body: updateSpaceBodySchema,
    responses: [ok(spaceEnvelopeSchema)],
  },
  {
    method: 'delete',
    path: `${BANK}/spaces/:spaceId`,
    summary: 'Remove a growing space.',
    access: 'grower',
    responses: [noContent()],
  },
  // Offers between banks.
  ...offerRoutes,

  // Keeping a variety true
  {
    method: 'get',
    path: `${BANK}/lots/:lotId/keeping-true`,
    summary:
      'The plants the lot was saved from and how its parent plants were kept apart, with warnings in words: fewer plants than the species’ minPlantsForSeed, or another variety of a crossing species (insect, wind, mixed) in the same season without a recorded isolation or closer than its isolationMeters.',
    access: 'viewer',
    responses: [ok(keepingTrueResponseSchema)],
  },
  {
    method: 'get',
    path: `${BANK}/grow-out`,
    summary:
      'The grow-out list: lots the advice calls `grow-out` (read from the ranking), with the plants a sound seed crop needs (minPlantsForSeed), the species’ isolation and, for a biennial, the seed season a year on.',
    access: 'viewer',
    query: onQuerySchema,
    responses: [ok(growOutResponseSchema)],
  },
];
