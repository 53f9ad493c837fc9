import fs from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import pino, { type Logger } from 'pino';
import type { Clock } from './clock';
import type { Config } from './config';
import type { ChangeFeed } from './db/change-feed';
import type { Db } from './db/database';
import { createReadCache, forgetOnWrites } from './db/read-cache';
import { compressResponses, hashedAssets, staticCacheHeaders } from './http/compression';
import { errorHandler, notFoundApi } from './http/errors';
import { idempotentWrites } from './http/idempotency';
import { refuseNul, requireUtf8 } from './http/input-guard';
import { originCheck, originVariants } from './http/origin-check';
import { authRateLimits, createRateLimiter } from './http/rate-limit';
import { requestLogging } from './http/request-log';
import { createMailQueue, type MailQueue } from './mail/mail-queue';
import type { Mailer } from './mail/mailer';
import { bankAccess } from './auth/bank-access';
import type { PasswordHasher } from './auth/password';
import { requireAuth, sessionMiddleware } from './auth/session.middleware';
import { createSessionSigner } from './auth/tokens';
import { authRouter, meRouter } from './modules/auth/auth.router';
import { createAuthService } from './modules/auth/auth.service';
import { bankRoutes, createBankRouter } from './modules/banks/banks.router';
import { createBanksService } from './modules/banks/banks.service';
import { devRouter } from './modules/dev/dev.router';
import { lotAssayRoutes, assayRoutes } from './modules/germination/germination.router';
import { createGerminationService, lotHasAssays } from './modules/germination/germination.service';
import { assaysCsvExport, assaysCsvImport } from './modules/germination/assays-csv.router';
import { createAssaysCsvService } from './modules/germination/assays-csv.service';
import { invitationsRouter } from './modules/invitations/invitations.router';
import { overviewRoutes } from './modules/overview/overview.router';
import { planRoutes } from './modules/plan/plan.router';
import { reminderRoutes } from './modules/reminders/reminders.router';
import { createPlanService } from './modules/plan/plan.service';
import { calendarFeedRoutes, calendarFileRoutes } from './modules/calendar/calendar.router';
import { createCalendarService } from './modules/calendar/calendar.service';
import { viabilityRoutes } from './modules/viability/viability.router';
import { createViabilityService } from './modules/viability/viability.service';
import { lotRoutes, lotsCsvExport } from './modules/lots/lots.router';
import { labelRoutes } from './modules/labels/labels.router';
import { createLabelsService } from './modules/labels/labels.service';
import { createLotsService } from './modules/lots/lots.service';
import { bankPhotoRoutes, photoFileRoutes, subjectPhotoRoutes } from './modules/photos/photos.router';
import { createPhotosService } from './modules/photos/photos.service';
import { lotKeepingTrueRoutes, plantRoutes } from './modules/plants/plants.router';
import { createPlantsService } from './modules/plants/plants.service';
import { speciesRoutes } from './modules/species/species.router';
import { createSpeciesService } from './modules/species/species.service';
import { spaceRoutes } from './modules/spaces/spaces.router';
import { createSpacesService } from './modules/spaces/spaces.service';
import { createInvitationsService } from './modules/invitations/invitations.service';
import { healthRouter } from './modules/health/health.router';
import { growOutRoutes } from './modules/grow-out/grow-out.router';
import { createGrowOutService } from './modules/grow-out/grow-out.service';
import { openApiRoutes } from './openapi/openapi.router';
// Offers between banks.
import { lotOfferRoutes, offersRouter, receivedRoutes } from './modules/offers/offers.router';
import { createOffersService } from './modules/offers/offers.service';
// Packet pages
import {
  PACKET_FONT_PATH,
  packetAssetRoutes,
  packetLookupRoutes,
  packetPageRoutes,
  publicPacketRoutes,
} from './modules/packet/packet.router';
import { createPacketService } from './modules/packet/packet.service';
import type { ObjectStore } from './storage/object-store';

export interface AppDeps {
  config: Config;
  db: Db;
  storage: ObjectStore;
  mailer: Mailer;
  clock: Clock;
  logger?: Logger;
  /**
   * PostgreSQL's change notices: with them, sessions, memberships and lot lists are kept between
   * requests (server/db/read-cache.ts); without, everything is read on every request.
   */
  changeFeed?: ChangeFeed;
  /** argon2id at full strength unless given; API tests pass a cheap one. */
  hasher?: PasswordHasher;
  /**
   * The durable mail queue (the server starts its polling worker). Without one, the app makes its
   * own, which sends right after each request that queues mail but does not poll for retries.
   */
  mailQueue?: MailQueue;
  /**
   * Sign-ups an hour from one address (server/http/rate-limit.ts) unless given; API tests, which
   * sign up hundreds of people from 127.0.0.1 under a clock that stands still, pass a larger one.
   */
  signUpLimit?: number;
}

export function createApp(deps: AppDeps): Express {
  const { config } = deps;
  const logger = deps.logger ?? pino({ level: config.logLevel });
  const app = express();
  app.disable('x-powered-by');
  // X-Forwarded-For names the client only when it comes from a proxy named in TRUST_PROXY.
  app.set('trust proxy', config.trustProxy);

  // The client's hashed files first, with only the headers a script or style needs (hashedAssets).
  const index = path.join(config.staticDir, 'index.html');
  const hasClient = fs.existsSync(index);
  if (hasClient) app.use('/assets', hashedAssets(config.staticDir));
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          // Served over plain http on loopback in development; a proxy adds https in production.
          'upgrade-insecure-requests': config.appOrigin.startsWith('https:') ? [] : null,
        },
      },
      strictTransportSecurity: config.appOrigin.startsWith('https:'),
    }),
  );
  app.use(compressResponses());
  app.use(requestLogging(logger, config.env !== 'test'));
  app.use(requireUtf8);
  app.use(express.json({ limit: '1mb' }));
  app.use(refuseNul);
  app.use(cookieParser());
  app.use(originCheck(originVariants(config.appOrigin)));
  const cache = createReadCache(deps.changeFeed);
  app.use(forgetOnWrites(cache));

  const signer = createSessionSigner(config.sessionSecret, deps.clock);
  const mailQueue = deps.mailQueue ?? createMailQueue({ ...deps, logger });
  const photos = createPhotosService({ db: deps.db, storage: deps.storage, clock: deps.clock, logger });
  const services = {
    auth: createAuthService({ ...deps, signer, mailQueue, appOrigin: config.appOrigin }),
    banks: createBanksService(deps),
    invitations: createInvitationsService({ ...deps, mailQueue, appOrigin: config.appOrigin }),
    species: createSpeciesService(deps),
    photos,
    plants: createPlantsService({
      ...deps,
      photosOf: photos.photosOf,
      removeSubjectPhotos: photos.removeSubjectPhotos,
    }),
    lots: createLotsService({
      ...deps,
      removeSubjectPhotos: photos.removeSubjectPhotos,
      hasAssays: lotHasAssays,
    }),
    germination: createGerminationService({ ...deps, removeSubjectPhotos: photos.removeSubjectPhotos }),
    viability: createViabilityService(deps),
    assaysCsv: createAssaysCsvService(deps),
  };
  const plan = createPlanService({ ...deps, viability: services.viability });
  const calendar = createCalendarService({
    ...deps,
    plan,
    secret: config.sessionSecret,
    appOrigin: config.appOrigin,
  });
  // Offers between banks.
  const offers = createOffersService({
    ...deps,
    mailQueue,
    appOrigin: config.appOrigin,
    lots: services.lots,
    viability: services.viability,
  });
  // Packet pages
  const packet = createPacketService({
    db: deps.db,
    viability: services.viability,
    secret: config.sessionSecret,
    appOrigin: config.appOrigin,
  });
  const secureCookies = config.appOrigin.startsWith('https:');
  const limits = authRateLimits(createRateLimiter({ db: deps.db, clock: deps.clock, logger }), {
    signUpLimit: deps.signUpLimit,
  });

  const api = express.Router();
  api.use('/health', healthRouter(deps));
  api.use(openApiRoutes({ production: config.env === 'production' }));
  api.use('/calendar', calendarFileRoutes(calendar));
  api.use(sessionMiddleware(deps.db, signer, deps.clock, cache));
  api.use(idempotentWrites(deps.db, deps.clock, logger));
  api.use('/auth', authRouter(services.auth, { secureCookies, limits }));
  api.use('/me', meRouter(services.auth));
  api.use('/invitations', invitationsRouter(services.invitations));
  api.use('/offers', offersRouter(offers));
  api.use('/banks', requireAuth, createBankRouter(services.banks));
  api.use('/photos', photoFileRoutes(services.photos));
  // Packet pages: the app's scanner finds the lot behind a packet page's QR code.
  api.use('/packet-pages', requireAuth, packetLookupRoutes(packet));
  // Every route of one bank sits behind bankAccess, which resolves the caller's role once.
  const bank = express.Router({ mergeParams: true });
  bank.use('/species', speciesRoutes(services.species));
  bank.use('/plants/:plantId/photos', subjectPhotoRoutes(services.photos, 'plant', 'plantId'));
  bank.use('/plants', plantRoutes(services.plants));
  bank.use('/lots/:lotId/photos', subjectPhotoRoutes(services.photos, 'lot', 'lotId'));
  bank.use('/lots/:lotId/tests', lotAssayRoutes(services.germination));
  bank.use(
    '/lots/:lotId/label.svg',
    labelRoutes(createLabelsService({ db: deps.db, appOrigin: config.appOrigin, packetUrl: packet.url })),
  );
  bank.use('/lots/:lotId/offers', lotOfferRoutes(offers));
  bank.use('/lots/:lotId/received', receivedRoutes(offers));
  bank.use('/lots/:lotId/packet-page', packetPageRoutes(packet));
  const viability = viabilityRoutes(services.viability);
  bank.use('/lots/:lotId', viability.lot);
  bank.use('/ranking', viability.ranking);
  const planRouters = planRoutes(plan, { ...deps, viability: services.viability });
  const spaces = spaceRoutes(createSpacesService({ ...deps, listPlan: plan.list }), deps);
  bank.use('/plan.ics', planRouters.ics);
  bank.use('/plan/space', spaces.plan);
  bank.use('/spaces', spaces.router);
  bank.use('/plan', planRouters.router);
  bank.use('/reminders', reminderRoutes(deps.db));
  bank.use('/calendar-feed', calendarFeedRoutes(calendar));
  bank.use('/overview', overviewRoutes({ ...deps, viability: services.viability }));
  bank.use('/tests/:testId/trays/:trayId/photos', subjectPhotoRoutes(services.photos, 'tray', 'trayId'));
  bank.use('/tests/import', assaysCsvImport(services.assaysCsv));
  bank.use('/tests', assayRoutes(services.germination));
  bank.use('/tests.csv', assaysCsvExport(services.assaysCsv));
  bank.use('/lots.csv', lotsCsvExport(services.lots));
  // Keeping a variety true.
  bank.use('/lots/:lotId/keeping-true', lotKeepingTrueRoutes(services.plants));
  bank.use(
    '/grow-out',
    growOutRoutes(createGrowOutService({ db: deps.db, viability: services.viability }), services.viability),
  );
  bank.use('/lots', lotRoutes(services.lots, services.species.list, cache));
  bank.use('/photos', bankPhotoRoutes(services.photos));
  bank.use('/', bankRoutes(services.banks, services.invitations));
  api.use('/banks/:bankId', bankAccess(deps.db), bank);
  api.use(notFoundApi);
  app.use('/api', api);

  // Packet pages: the public page and its font files, outside /api and the app's shell.
  app.use('/p', publicPacketRoutes(packet));
  app.use(PACKET_FONT_PATH, packetAssetRoutes());

  if (config.env !== 'production') app.use('/dev', devRouter(config.outboxDir));

  // The built client, with the SPA's index.html for every other path.
  if (hasClient) {
    app.use(
      express.static(config.staticDir, {
        index: false,
        cacheControl: false,
        setHeaders: staticCacheHeaders,
      }),
    );
    app.get('/{*path}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(index);
    });
  }

  app.use(errorHandler(logger));
  return app;
}
