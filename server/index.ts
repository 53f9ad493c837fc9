// The server's entry point: the only module with side effects at import.
import type { AddressInfo } from 'node:net';
import pino from 'pino';
import { createApp } from './app';
import { systemClock } from './clock';
import { ConfigError, loadConfig } from './config';
import { startChangeFeed } from './db/change-feed';
import { createDb } from './db/database';
import { createReminders } from './modules/reminders/reminders.service';
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
const db = createDb(config.databaseUrl, config.databasePoolSize);
const storage = createObjectStore(config.storage);
const mailer = createMailer(config.mail);
const changeFeed = startChangeFeed(config.databaseUrl, logger);
const app = createApp({ config, db, storage, mailer, clock: systemClock, logger, changeFeed });

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
reminders
  .start()
  .then(() => {
    const run = () => reminders.tick().catch((error) => logger.warn({ err: error }, 'reminder scan failed'));
    void run();
    scan = setInterval(run, REMINDER_SCAN_MS);
  })
  .catch((error) => logger.error({ err: error }, 'the reminder queue did not start; reminders are paused'));

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
  server.close(async () => {
    await reminders.stop().catch(() => undefined);
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
