// The server's entry point: the only module with side effects at import.
import type { AddressInfo } from 'node:net';
import pino from 'pino';
import { createApp } from './app';
import { systemClock } from './clock';
import { ConfigError, loadConfig } from './config';
import { startChangeFeed } from './db/change-feed';
import { createDb } from './db/database';
import { createReminders } from './modules/reminders/reminders.service';
import { createMailQueue } from './mail/mail-queue';
import { createMailer } from './mail/mailer';
import { createViabilityService } from './modules/viability/viability.service';
import { createObjectStore } from './storage/object-store';

let config;
try {
  config = loadConfig();
} catch (error) {
  if (error instanceof ConfigError) {
    process.stderr.write(`hilum: ${error.message}\n`);
    process.exit(1);
  }
  throw error;
}

const logger = pino({ level: config.logLevel });

// A promise nobody awaited (a background task's failure) is logged, never fatal: the request
// paths answer their own errors, and a database or mail outage must not end the process.
process.on('unhandledRejection', (reason) => {
  logger.error({ err: reason }, 'a background task failed (unhandled rejection); the server keeps running');
});
// A thrown exception nobody caught leaves the process in an unknown state: log it and exit, and the
// supervisor (`npm start`, or the production process manager) starts a fresh server.
process.on('uncaughtException', (error) => {
  logger.fatal({ err: error }, 'uncaught exception; the server stops');
  process.exit(1);
});

const db = createDb(config.databaseUrl, config.databasePoolSize, undefined, logger);
const storage = createObjectStore(config.storage);
const mailer = createMailer(config.mail);
const changeFeed = startChangeFeed(config.databaseUrl, logger);
// Every server runs the mail worker; rows are claimed one at a time, so each mail is sent once.
const mailQueue = createMailQueue({ db, mailer, clock: systemClock, logger });
const app = createApp({ config, db, storage, mailer, mailQueue, clock: systemClock, logger, changeFeed });
mailQueue.start();

const reminders = createReminders({
  db,
  databaseUrl: config.databaseUrl,
  mailer,
  clock: systemClock,
  appOrigin: config.appOrigin,
  viability: createViabilityService({ db }),
  logger,
});
// The scan is cheap and idempotent: every app server may run it; each reminder is sent once.
const REMINDER_SCAN_MS = 60_000;
let scan: NodeJS.Timeout | undefined;
let startRetry: NodeJS.Timeout | undefined;
// The queue needs the database: while it is down at boot, starting is tried again with backoff.
function startReminders(attempt = 0) {
  reminders
    .start()
    .then(() => {
      // A scan that queued reminders is worth a line; the empty ones only at LOG_LEVEL=debug.
      const run = () => {
        const started = Date.now();
        return reminders
          .tick()
          .then((queued) =>
            logger[queued ? 'info' : 'debug']({ queued, ms: Date.now() - started }, 'reminder scan'),
          )
          .catch((error) => logger.warn({ err: error }, 'reminder scan failed'));
      };
      void run();
      scan = setInterval(run, REMINDER_SCAN_MS);
    })
    .catch(async (error) => {
      const delay = Math.min(60_000, 2_000 * 2 ** attempt);
      logger.error({ err: error }, `the reminder queue did not start; trying again in ${delay / 1000} s`);
      await reminders.stop().catch(() => undefined);
      if (!stopping) startRetry = setTimeout(() => startReminders(attempt + 1), delay);
    });
}
startReminders();

const server = app.listen(config.port, config.host);
server.on('listening', () => {
  const { port } = server.address() as AddressInfo;
  logger.info(`Hilum listening on http://${config.host}:${port}`);
  process.send?.({ type: 'listening', port });
});
server.on('error', (error: NodeJS.ErrnoException) => {
  const reason =
    error.code === 'EADDRINUSE' ? `port ${config.port} is already in use (set PORT)` : error.message;
  process.stderr.write(`hilum: the server could not start: ${reason}\n`);
  process.exit(1);
});

let stopping = false;
async function shutdown(signal: string) {
  if (stopping) return;
  stopping = true;
  logger.info(`${signal}: finishing in-flight requests`);
  const force = setTimeout(() => process.exit(1), 10_000);
  force.unref();
  // Stop accepting; idle keep-alive sockets close now, busy ones after their response.
  if (scan) clearInterval(scan);
  if (startRetry) clearTimeout(startRetry);
  server.close(async () => {
    await reminders.stop().catch(() => undefined);
    await mailQueue.stop().catch(() => undefined);
    await changeFeed.close();
    await db.destroy();
    storage.close();
    mailer.close();
    process.exit(0);
  });
  server.closeIdleConnections();
}
process.on('SIGTERM', () => void shutdown('SIGTERM'));
process.on('SIGINT', () => void shutdown('SIGINT'));
