// Two compiled app servers behind a real nginx (Debian's, installed by `npm test`), as several servers
// run in production: one PostgreSQL database, the suite's object-store and SMTP fakes, nginx on
// loopback sharing requests round robin. Everything is asked of nginx; the servers' own logs and
// direct calls show which server answered.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'kysely';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays } from '#shared/dates';
import { localNow } from '#shared/local-time';
import { REMINDER_QUEUE } from '#server/jobs/reminders';
import { readOutbox } from '#server/mail/outbox';
import { PASSWORD, uniqueEmail } from '../helpers/accounts';
import {
  buildCompiledServer,
  launchCompiledServer,
  prepareDatabase,
  services as loadServices,
  sessionSecret,
  waitFor,
  type Built,
  type ServerProcess,
} from '../helpers/compiled-server';
import { createTestDatabase } from '../helpers/context';
import { postFrom } from '../helpers/from-address';
import { jpeg } from '../helpers/images';

/** Debian's nginx: scripts/test.mjs installs it (as root) and names it; a machine without it skips. */
const NGINX = process.env.HILUM_NGINX || (fs.existsSync('/usr/sbin/nginx') ? '/usr/sbin/nginx' : '');
const isRoot = process.getuid?.() === 0;
/** The header nginx adds (in this test's configuration only) naming the server that answered. */
const UPSTREAM = 'x-hilum-upstream';
const WRONG = 'not the right password';

/**
 * The nginx configuration of the test, with what production needs (README, "Beyond one machine"):
 * an upstream of the app servers shared round robin, X-Forwarded-For extended with the address nginx
 * saw, bodies as large as a photo upload. Everything nginx writes stays in `dir`; running as root,
 * its workers stay root so they can write there (production keeps Debian's `user www-data`).
 */
function nginxConfig(dir: string, listen: number, upstreams: number[]) {
  const at = (name: string) => path.join(dir, name);
  return `
${isRoot ? 'user root;' : ''}
worker_processes 1;
daemon off;
pid ${at('nginx.pid')};
error_log ${at('error.log')} warn;
events { worker_connections 512; }
http {
  log_format upstreams '$remote_addr "$request" $status upstream=$upstream_addr';
  access_log ${at('access.log')} upstreams;
  client_body_temp_path ${at('client_body')};
  proxy_temp_path ${at('proxy')};
  fastcgi_temp_path ${at('fastcgi')};
  uwsgi_temp_path ${at('uwsgi')};
  scgi_temp_path ${at('scgi')};
  # Photos may be 15 MiB (server/photos/upload.ts); nginx refuses bodies over 1 MiB unless told.
  client_max_body_size 16m;

  upstream hilum {
    # Round robin (nginx's default). A server that refuses a connection is marked down for 10 s
    # and the request goes to the next one.
    server 127.0.0.1:${upstreams[0]} max_fails=1 fail_timeout=10s;
    server 127.0.0.1:${upstreams[1]} max_fails=1 fail_timeout=10s;
    keepalive 16;
    # Below Node's own keep-alive timeout (5 s), so nginx never reuses a connection Node is closing.
    keepalive_timeout 4s;
  }
  server {
    listen 127.0.0.1:${listen};
    location / {
      proxy_pass http://hilum;
      proxy_http_version 1.1;
      proxy_set_header Connection "";
      proxy_set_header Host $host;
      proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
      proxy_set_header X-Forwarded-Proto $scheme;
      # For this test only: which server answered.
      add_header X-Hilum-Upstream $upstream_addr always;
    }
  }
}
`;
}

interface LogLine {
  time: number;
  msg: string;
  queued?: number;
  /** How long a reminder scan took: it began at `time - ms`. */
  ms?: number;
  req?: { method: string; url: string };
  res?: { statusCode: number };
}
/** A server's production log, one JSON object a line (pino). */
const logOf = (server: ServerProcess): LogLine[] =>
  server
    .output()
    .split('\n')
    .filter((line) => line.startsWith('{'))
    .map((line) => JSON.parse(line) as LogLine);
/** The requests a server logged: method, path and status. */
const requestsOf = (server: ServerProcess) =>
  logOf(server)
    .filter((l) => l.req && l.res)
    .map((l) => ({ method: l.req!.method, url: l.req!.url, status: l.res!.statusCode }));

/** What this test reads of the app's JSON answers (fields absent where an answer has none). */
interface Body {
  user: { email: string };
  bank: { id: string };
  lot: { id: string; code: string };
  items: { id: string; commonName: string; traits: { firstCountDay: number } }[];
  nextCursor: string | null;
  error?: { code: string };
}

/** A GET on the app at `port` from 127.0.0.1, with the cookie: status, upstream, JSON or bytes. */
async function get(port: number, url: string, cookie = '') {
  const res = await fetch(`http://127.0.0.1:${port}${url}`, { headers: { cookie } });
  const type = res.headers.get('content-type') ?? '';
  return {
    status: res.status,
    upstream: res.headers.get(UPSTREAM) ?? '',
    type,
    ...(type.includes('json')
      ? { body: (await res.json()) as Body, bytes: Buffer.alloc(0) }
      : { body: {} as Body, bytes: Buffer.from(await res.arrayBuffer()) }),
  };
}
async function postJson(port: number, url: string, body: unknown, cookie = '') {
  const res = await fetch(`http://127.0.0.1:${port}${url}`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie },
    body: JSON.stringify(body),
  });
  const type = res.headers.get('content-type') ?? '';
  return {
    status: res.status,
    upstream: res.headers.get(UPSTREAM) ?? '',
    appJson: type.includes('application/json'),
    cookie: res.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; '),
    body: (type.includes('json') ? await res.json() : { text: await res.text() }) as Body,
  };
}

describe.skipIf(!NGINX)('two app servers behind nginx, on one PostgreSQL', () => {
  let tmp = '';
  let built: Built | undefined;
  let database: Awaited<ReturnType<typeof createTestDatabase>> | undefined;
  let nginx: ChildProcess | undefined;
  let nginxExited = '';
  const servers: ServerProcess[] = [];
  const crashes: string[] = [];
  let ports: number[] = [];
  let front = 0; // nginx's port
  const addressOf = (i: number) => `127.0.0.1:${ports[i]}`;

  // The owner of the bank every part below uses, signed in through nginx.
  const owner = { email: uniqueEmail('front'), cookie: '', bankId: '', speciesId: '' };
  // The reminders written before both servers' scans: their test codes and when they were due.
  const reminderCodes: string[] = [];
  let remindersReadyAt = 0;

  beforeAll(async () => {
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-two-servers-'));
    const services = await loadServices();
    built = await buildCompiledServer('two-servers-test');
    // A database of this test on the suite's cluster, prepared by the compiled preparation.
    database = await createTestDatabase({ migrate: false });
    ports = [await services.freePort(), await services.freePort()];
    front = await services.freePort();
    const env = {
      ...process.env,
      NODE_ENV: 'production',
      // One signing secret for every server.
      SESSION_SECRET: sessionSecret(),
      DATABASE_URL: database.url,
      DATABASE_POOL_SIZE: '4',
      HILUM_DATA_DIR: tmp,
      HOST: '127.0.0.1',
      APP_ORIGIN: `http://127.0.0.1:${front}`,
      // Debug: the request lines, and a line for every reminder scan (server/index.ts).
      LOG_LEVEL: 'debug',
      // nginx reaches the servers from 127.0.0.1: only that address's X-Forwarded-For is believed.
      // (In production `loopback` is right for an nginx on the same machine; here the clients are
      // on loopback too, and `loopback` would trust a client's own X-Forwarded-For as a proxy's.)
      TRUST_PROXY: '127.0.0.1',
    };
    const prepared = prepareDatabase(built, env);
    expect(prepared.status, prepared.output).toBe(0);
    // servers[i] listens on ports[i]; each is kept as soon as it runs, for afterAll to stop.
    await Promise.all(
      ports.map(async (port, i) => {
        servers[i] = await launchCompiledServer(
          built!,
          { ...env, PORT: String(port) },
          { onCrash: (how) => crashes.push(`server ${i + 1}: ${how}`) },
        );
      }),
    );

    fs.writeFileSync(path.join(tmp, 'nginx.conf'), nginxConfig(tmp, front, ports));
    nginx = spawn(NGINX, ['-p', tmp, '-c', path.join(tmp, 'nginx.conf'), '-e', path.join(tmp, 'error.log')], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let nginxOutput = '';
    nginx.stdout!.on('data', (c) => (nginxOutput += c));
    nginx.stderr!.on('data', (c) => (nginxOutput += c));
    nginx.once('exit', (code, signal) => (nginxExited = `code ${code}, signal ${signal}`));
    const errorLog = () =>
      nginxOutput +
      (fs.existsSync(path.join(tmp, 'error.log'))
        ? fs.readFileSync(path.join(tmp, 'error.log'), 'utf8')
        : '');
    // Ready when a health check through nginx answers 200 from each server.
    const seen = new Set<string>();
    await waitFor(
      'nginx to pass health checks to both servers',
      async () => {
        const health = await get(front, '/api/health').catch(() => null);
        if (health?.status === 200) seen.add(health.upstream);
        return seen.size === 2;
      },
      {
        timeoutMs: 60_000,
        abort: () => (nginxExited ? `nginx exited (${nginxExited})` : ''),
        detail: errorLog,
      },
    );
    expect([...seen].sort()).toEqual([addressOf(0), addressOf(1)].sort());

    // The owner, a bank on a calendar where it is now day time, and some germination tests whose
    // first count day is today: their reminders are due at the servers' next scan.
    const registered = await postJson(front, '/api/auth/register', {
      email: owner.email,
      password: PASSWORD,
      name: 'Front Owner',
    });
    expect(registered.status).toBe(201);
    owner.cookie = registered.cookie;
    const zone = dayTimeZone();
    const bank = await postJson(front, '/api/banks', { name: 'Two servers', timeZone: zone }, owner.cookie);
    expect(bank.status, JSON.stringify(bank.body)).toBe(201);
    owner.bankId = bank.body.bank.id;
    const species = await get(front, `/api/banks/${owner.bankId}/species?limit=500`, owner.cookie);
    const tomato = species.body.items.find((s) => s.commonName === 'Tomato')!;
    owner.speciesId = tomato.id;
    // Tomato's first count day from the reference species (REFERENCES.md).
    const firstCountDay: number = tomato.traits.firstCountDay;
    const today = localNow(new Date(), zone).date;
    for (let i = 0; i < 3; i++) {
      const lot = await postJson(
        front,
        `/api/banks/${owner.bankId}/lots`,
        lotBody(`Reminded ${i}`),
        owner.cookie,
      );
      expect(lot.status).toBe(201);
      const test = await postJson(
        front,
        `/api/banks/${owner.bankId}/lots/${lot.body.lot.id}/tests`,
        { startDate: addDays(today, -firstCountDay), method: 'paper towel', trays: [{ seedsSown: 25 }] },
        owner.cookie,
      );
      expect(test.status, JSON.stringify(test.body)).toBe(201);
      reminderCodes.push(lot.body.lot.code);
    }
    remindersReadyAt = Date.now();
  }, 240_000);

  afterAll(async () => {
    const steps: (() => unknown)[] = [
      async () => {
        if (!nginx || nginx.exitCode !== null || nginx.signalCode !== null) return;
        const exited = new Promise((r) => nginx!.once('exit', r));
        nginx.kill('SIGTERM');
        const force = setTimeout(() => nginx!.kill('SIGKILL'), 10_000);
        await exited;
        clearTimeout(force);
      },
      ...servers.map((s) => () => s.stop()),
      () => database?.drop(),
      () => built?.remove(),
      () => tmp && fs.rmSync(tmp, { recursive: true, force: true }),
    ];
    for (const step of steps) {
      try {
        await step();
      } catch {
        // keep cleaning
      }
    }
  }, 60_000);

  const lotBody = (variety: string) => ({
    speciesId: owner.speciesId,
    variety,
    origin: 'saved',
    harvestDate: '2026-08-01',
    seedCount: 100,
  });

  it('when someone signs in through nginx, then both servers know the session, and a sign-out on one ends it on the other', async () => {
    const login = await postJson(front, '/api/auth/login', { email: owner.email, password: PASSWORD });
    expect(login.status).toBe(200);
    const cookie = login.cookie;
    expect(cookie).toMatch(/^hilum_session=/);
    // Round robin: the next requests of the session go to both servers, and each knows it.
    const answered = new Set<string>();
    for (let i = 0; i < 4; i++) {
      const me = await get(front, '/api/me', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(owner.email);
      answered.add(me.upstream);
    }
    expect([...answered].sort()).toEqual([addressOf(0), addressOf(1)].sort());
    // Asked directly, each server knows the session; their own logs show the requests they answered.
    for (const [i, port] of ports.entries()) {
      const me = await get(port, '/api/me', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(owner.email);
      // Log lines arrive through a pipe after the answer: waited for.
      await expect
        .poll(() => requestsOf(servers[i]!).filter((r) => r.url === '/api/me' && r.status === 200).length, {
          timeout: 30_000,
        })
        .toBeGreaterThanOrEqual(2);
    }

    // Signed out through nginx (one server): the other forgets the session on PostgreSQL's change
    // notice, within moments.
    const out = await postJson(front, '/api/auth/logout', {}, cookie);
    expect(out.status).toBe(204);
    const outAt = Date.now();
    for (const port of ports) {
      await waitFor(
        'the session to end on both servers',
        async () => (await get(port, '/api/me', cookie)).status === 401,
        {
          timeoutMs: 30_000,
        },
      );
    }
    console.info(`two servers: a sign-out reached the other server within ${Date.now() - outAt} ms`);
  });

  it('when sign-ins fail through nginx on both servers, then they count together: the sixth is 429, as on one server', async () => {
    // Through nginx, from the client address 127.0.0.41, each try claiming another address in its
    // own X-Forwarded-For: nginx appends the address it saw, and the servers believe only that.
    const target = await postJson(front, '/api/auth/register', {
      email: uniqueEmail('limited'),
      password: PASSWORD,
      name: 'Limited',
    });
    expect(target.status).toBe(201);
    const email: string = target.body.user.email;
    const viaNginx = [];
    for (let i = 1; i <= 6; i++) {
      viaNginx.push(
        await postFrom(
          front,
          '127.0.0.41',
          '/api/auth/login',
          { email, password: i === 6 ? PASSWORD : WRONG },
          { 'x-forwarded-for': `203.0.113.${i}` },
        ),
      );
    }
    // The same on one server alone, straight from the client 127.0.0.43, for another account.
    const alone = await postJson(ports[0]!, '/api/auth/register', {
      email: uniqueEmail('alone'),
      password: PASSWORD,
      name: 'Alone',
    });
    const direct = [];
    for (let i = 1; i <= 6; i++) {
      direct.push(
        await postFrom(ports[0]!, '127.0.0.43', '/api/auth/login', {
          email: alone.body.user.email,
          password: i === 6 ? PASSWORD : WRONG,
        }),
      );
    }
    expect(viaNginx.map((a) => a.status)).toEqual([401, 401, 401, 401, 401, 429]);
    expect(direct.map((a) => a.status)).toEqual(viaNginx.map((a) => a.status));
    expect(viaNginx[5]!.body.error?.code).toBe('rate_limited');
    // The failures were spread over both servers.
    const failedOn = new Set(viaNginx.slice(0, 5).map((a) => a.headers[UPSTREAM]));
    expect([...failedOn].sort()).toEqual([addressOf(0), addressOf(1)].sort());
    // The count was of 127.0.0.41 (nginx's $remote_addr), neither of nginx itself nor of the claimed
    // addresses: the owner, from their own address through the same nginx, signs in on both servers.
    const signedIn = new Set<string>();
    for (let i = 0; i < 2; i++) {
      const own = await postFrom(front, '127.0.0.42', '/api/auth/login', { email, password: PASSWORD });
      expect(own.status).toBe(200);
      signedIn.add(String(own.headers[UPSTREAM]));
    }
    expect(signedIn.size).toBe(2);
  });

  it('when a photo is uploaded through nginx, then the other server serves it', async () => {
    const lot = await postJson(
      front,
      `/api/banks/${owner.bankId}/lots`,
      lotBody('Photographed'),
      owner.cookie,
    );
    expect(lot.status).toBe(201);
    const image = await jpeg({ width: 640, height: 480 });
    const form = new FormData();
    form.append('photo', new Blob([new Uint8Array(image)], { type: 'image/jpeg' }), 'tray.jpg');
    const upload = await fetch(
      `http://127.0.0.1:${front}/api/banks/${owner.bankId}/lots/${lot.body.lot.id}/photos`,
      {
        method: 'POST',
        headers: { cookie: owner.cookie },
        body: form,
      },
    );
    expect(upload.status).toBe(201);
    const took = upload.headers.get(UPSTREAM);
    const photo = (await upload.json()).photo as { url: string; width: number; height: number };
    const other = ports[took === addressOf(0) ? 1 : 0]!;
    expect(took).not.toBe(`127.0.0.1:${other}`);
    const served = await get(other, photo.url, owner.cookie);
    expect(served.status).toBe(200);
    // Stored re-encoded as WebP (server/photos), the same bytes from the server that took it.
    expect(served.type).toBe('image/webp');
    const meta = await sharp(served.bytes).metadata();
    const fromTaker = await get(ports[1 - ports.indexOf(other)]!, photo.url, owner.cookie);
    expect(fromTaker.status).toBe(200);
    expect(fromTaker.bytes.equals(served.bytes)).toBe(true);
    expect([meta.width, meta.height]).toEqual([photo.width, photo.height]);
    // The other server's request log says it answered: its line arrives through a pipe, after the
    // answer, so it is waited for.
    await expect
      .poll(
        () => requestsOf(servers[ports.indexOf(other)]!).some((r) => r.url === photo.url && r.status === 200),
        { timeout: 30_000 },
      )
      .toBe(true);
  });

  it('when both servers run their job workers, then each reminder is mailed exactly once', async () => {
    // Both servers scan every minute (server/index.ts): wait until each has begun a scan after the
    // reminders were due, and the queue holds nothing waiting, retrying or running.
    const scannedSince = (server: ServerProcess) =>
      logOf(server).some((l) => l.msg === 'reminder scan' && l.time - (l.ms ?? 0) > remindersReadyAt);
    await waitFor('a reminder scan on both servers', () => servers.every(scannedSince), {
      timeoutMs: 180_000,
      abort: () => crashes.join('; '),
    });
    const pending = async () => {
      const { rows } = await sql<{ n: string }>`
        select count(*) as n from pgboss.job where name = ${REMINDER_QUEUE} and state < 'completed'`.execute(
        database!.db,
      );
      return Number(rows[0]!.n);
    };
    const rows = () =>
      database!.db
        .selectFrom('reminders')
        .innerJoin('users', 'users.id', 'reminders.user_id')
        .select(['reminders.subject', 'reminders.sent_at', 'users.email'])
        .execute();
    await waitFor(
      'every reminder sent and the queue settled',
      async () => (await pending()) === 0 && (await rows()).every((r) => r.sent_at),
      {
        timeoutMs: 120_000,
      },
    );
    const written = await rows();
    // The three check-day reminders (and whatever else is due today, such as a Monday digest).
    for (const code of reminderCodes) {
      expect(written.filter((r) => r.subject.includes(code) && r.email === owner.email)).toHaveLength(1);
    }
    // Each reminder row reached the SMTP fake once: no server sent one twice.
    const mails = (await readOutbox(process.env.OUTBOX_DIR!, 3000)).filter((m) => m.to.includes(owner.email));
    for (const row of written) {
      expect(
        mails.filter((m) => m.subject === row.subject),
        row.subject,
      ).toHaveLength(1);
    }
    // What each server's scans queued adds up to the rows: they did not write one twice either.
    const queued = servers.flatMap((s) =>
      logOf(s)
        .filter((l) => l.msg === 'reminder scan')
        .map((l) => l.queued ?? 0),
    );
    expect(queued.reduce((a, b) => a + b, 0)).toBe(written.length);
    const scans = servers.map((s) =>
      logOf(s)
        .filter((l) => l.msg === 'reminder scan')
        .map((l) => l.queued),
    );
    console.info(
      `two servers: ${written.length} reminders, each mailed once; queued by scan: ${JSON.stringify(scans)}`,
    );
  }, 300_000);

  it('when one server is killed during a stream of writes, then no acknowledged write is lost and the other serves on', async () => {
    interface Answer {
      sentAt: number;
      at: number;
      status: number; // 0: no HTTP answer at all
      upstream: string;
      appJson: boolean;
      id?: string;
    }
    const answers: Answer[] = [];
    let stop = false;
    let killedAt = Number.POSITIVE_INFINITY;
    let n = 0;
    async function worker() {
      while (!stop && n < 5_000) {
        const sentAt = Date.now();
        const i = n++;
        try {
          const created = await postJson(
            front,
            `/api/banks/${owner.bankId}/lots`,
            lotBody(`Load ${i}`),
            owner.cookie,
          );
          answers.push({
            sentAt,
            at: Date.now(),
            status: created.status,
            upstream: created.upstream,
            appJson: created.appJson,
            id: created.status === 201 ? created.body.lot.id : undefined,
          });
        } catch {
          answers.push({ sentAt, at: Date.now(), status: 0, upstream: '', appJson: false });
        }
      }
    }
    const acknowledged = () => answers.filter((a) => a.id);
    const detail = () => JSON.stringify(answers.slice(-20));
    const hardStop = setTimeout(() => (stop = true), 240_000);
    const workers = Array.from({ length: 8 }, () => worker());
    try {
      await waitFor(
        'writes acknowledged by both servers',
        () => acknowledged().length >= 30 && new Set(acknowledged().map((a) => a.upstream)).size === 2,
        { detail },
      );
      const killAt = Date.now();
      await servers[0]!.kill();
      killedAt = Date.now();
      const before = acknowledged().length;
      await waitFor('writes acknowledged after the kill', () => acknowledged().length >= before + 40, {
        timeoutMs: 120_000,
        detail,
      });
      stop = true;
      await Promise.all(workers);

      const failed = answers.filter((a) => a.status < 200 || a.status >= 300);
      const survivor = addressOf(1);
      console.info(
        `two servers: ${answers.length} creates, ${acknowledged().length} acknowledged; killed in ${killedAt - killAt} ms; ` +
          `failed: ${JSON.stringify(failed.map((a) => ({ status: a.status, upstream: a.upstream, ms: a.at - killAt })))}`,
      );
      // The only failures are the requests the killed server had in flight: nginx's own 502 (not
      // the app's JSON error), naming the killed server, at most one per client connection.
      for (const f of failed) {
        expect(f.status).toBe(502);
        expect(f.appJson).toBe(false);
        expect(f.upstream).toContain(addressOf(0));
        expect(f.sentAt).toBeLessThanOrEqual(killedAt);
      }
      expect(failed.length).toBeLessThanOrEqual(8);
      // Every request sent after the killed server was gone was answered 2xx by the survivor (nginx
      // found the dead one refusing and passed the request on), never a 5xx.
      const after = answers.filter((a) => a.sentAt > killedAt);
      expect(after.length).toBeGreaterThanOrEqual(40);
      for (const a of after) {
        expect(a.status).toBe(201);
        expect(a.upstream.split(', ').at(-1)).toBe(survivor);
      }
      expect(requestsOf(servers[1]!).filter((r) => r.status >= 500)).toEqual([]);

      // No acknowledged write is lost: each is a row, under a code of its own.
      const ids = acknowledged().map((a) => a.id!);
      const stored = await database!.db
        .selectFrom('lots')
        .select(['id', 'code'])
        .where('id', 'in', ids)
        .execute();
      expect(stored).toHaveLength(ids.length);
      expect(new Set(stored.map((r) => r.code)).size).toBe(ids.length);
      const written = await database!.db
        .selectFrom('lots')
        .select((eb) => eb.fn.countAll<string>().as('n'))
        .where('bank_id', '=', owner.bankId)
        .where('variety', 'like', 'Load %')
        .executeTakeFirstOrThrow();
      // A create the killed server committed but never answered is a row nobody was told of.
      console.info(
        `two servers: ${Number(written.n) - ids.length} of ${failed.length} failed creates were committed all the same`,
      );
      // And the survivor, through nginx, lists every one of them.
      const listed = new Set<string>();
      let cursor: string | null = '';
      while (cursor !== null) {
        const page = await get(
          front,
          `/api/banks/${owner.bankId}/lots?limit=500${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`,
          owner.cookie,
        );
        expect(page.status).toBe(200);
        expect(page.upstream).toBe(survivor);
        for (const lot of page.body.items) listed.add(lot.id);
        cursor = page.body.nextCursor;
      }
      expect(ids.filter((id) => !listed.has(id))).toEqual([]);
      // The kill was the test's; neither server ended otherwise.
      expect(crashes).toEqual([]);
    } finally {
      stop = true;
      clearTimeout(hardStop);
      await Promise.all(workers);
    }
  }, 300_000);
});

/**
 * An IANA zone (Etc/GMT±h) where it is now 12:00 to 12:59: past the reminders' morning
 * hour and far from midnight, so "today" holds while the test runs.
 */
function dayTimeZone(): string {
  const hour = new Date().getUTCHours();
  const ahead = 12 - hour; // hours east of UTC; Etc/GMT names count the other way
  return ahead === 0 ? 'Etc/GMT' : ahead > 0 ? `Etc/GMT-${ahead}` : `Etc/GMT+${-ahead}`;
}
