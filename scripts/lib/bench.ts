// What the benchmark scripts share: the app served on 127.0.0.1, signing in over HTTP,
// and timing medians.
import type { AddressInfo } from 'node:net';
import http, { type Server } from 'node:http';
import { createApp } from '#server/app';
import { systemClock } from '#server/clock';
import type { Config } from '#server/config';
import { startChangeFeed } from '#server/db/change-feed';
import type { Db } from '#server/db/database';
import { createMailer } from '#server/mail/mailer';
import { createObjectStore } from '#server/storage/object-store';

/** Listens on an ephemeral port of 127.0.0.1 and resolves to the base URL. */
export async function listenLocal(server: Server): Promise<string> {
  if (!server.listening) await new Promise((resolve) => server.once('listening', resolve));
  return `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}

/**
 * The whole app, as `npm start` builds it, on an ephemeral loopback port, with that address as its
 * own origin (so a browser's writes pass the origin check).
 */
export async function serveApp(config: Config, db: Db) {
  const storage = createObjectStore(config.storage);
  const mailer = createMailer(config.mail);
  const changeFeed = startChangeFeed(config.databaseUrl);
  await changeFeed.ready();
  const server = http.createServer().listen(0, '127.0.0.1');
  const base = await listenLocal(server);
  server.on(
    'request',
    createApp({
      config: { ...config, appOrigin: base },
      db,
      storage,
      mailer,
      clock: systemClock,
      changeFeed,
    }),
  );
  return {
    base,
    async close() {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
      storage.close();
      mailer.close();
      await changeFeed.close();
    },
  };
}

/** Signs in through the API and returns the session cookie as a request header value. */
export async function signIn(base: string, email: string, password: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  const cookie = res.headers.get('set-cookie')?.split(';')[0];
  if (res.status !== 200 || !cookie) throw new Error(`sign-in answered ${res.status}`);
  return cookie;
}

export const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/** Median duration of `runs` calls after two warm-up calls, in milliseconds. */
export async function timeMedian(runs: number, fn: () => Promise<unknown>): Promise<number> {
  for (let i = 0; i < 2; i++) await fn();
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await fn();
    samples.push(performance.now() - t0);
  }
  return median(samples);
}
