// A PostgreSQL restart under load, against the compiled production server as a child process.
// The suite's shared cluster serves every other test file, so this one starts a cluster of its own
// (scripts/lib/services.mjs, as `npm start` and `npm test` do) and restarts that one.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '#server/db/database';
import {
  buildCompiledServer,
  launchCompiledServer,
  prepareDatabase,
  services as loadServices,
  sessionSecret,
  waitFor as poll,
  type Built,
  type Cluster,
  type ServerProcess,
  type Services,
} from '../helpers/compiled-server';

/** What a timed-out wait reports beside its name: the answers so far and the server's last lines. */
let progress = () => '';
/** Set once the server process has exited: every wait stops at once and says so. */
let serverGone = '';
/** Resolves once `check` returns a value, polling; fails with `what` after `ms`. */
const waitFor = <T>(what: string, check: () => T | undefined | false, ms = 60_000) =>
  poll(what, check, {
    timeoutMs: ms,
    abort: () => (serverGone ? `the server exited (${serverGone})` : ''),
    detail: progress,
  });

interface Answer {
  at: number;
  status: number; // 0: no HTTP answer at all (connection refused or reset)
  code?: string;
  kind: 'read' | 'write';
}

describe('a PostgreSQL restart under load (compiled server, cluster of its own)', () => {
  let services: Services;
  let cluster: Cluster;
  let server: ServerProcess;
  let db: Db;
  let exits = 0;
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-fault-'));
  let base = '';
  let env: NodeJS.ProcessEnv = {};
  let built: Built;
  let cookie = '';
  const serverLog = () => server?.output() ?? '';

  beforeAll(async () => {
    fs.chmodSync(tmp, 0o755);
    services = await loadServices();
    built = await buildCompiledServer('fault-test');

    cluster = await services.startPostgres({
      bin: services.ensurePostgres(),
      dataDir: tmp,
      port: await services.freePort(),
      database: 'hilum',
      durable: false,
    });
    const port = await services.freePort();
    base = `http://127.0.0.1:${port}`;
    env = {
      ...process.env,
      NODE_ENV: 'production',
      SESSION_SECRET: sessionSecret(),
      DATABASE_URL: cluster.url,
      HILUM_DATA_DIR: tmp,
      PORT: String(port),
      HOST: '127.0.0.1',
      APP_ORIGIN: base,
      LOG_LEVEL: 'warn',
    };
    // The compiled database preparation, as a deployment runs it before the server.
    const prepared = prepareDatabase(built, env);
    expect(prepared.status, prepared.output).toBe(0);
    await launch();
    db = createDb(cluster.url, 2);
  }, 180_000);

  /** `npm run serve`'s command: plain Node on the compiled file, no TypeScript loader. */
  async function launch() {
    serverGone = '';
    server = await launchCompiledServer(built, env, {
      onCrash: (how) => {
        exits += 1;
        serverGone = how;
      },
    });
  }
  const stopServer = async () => server?.stop();

  afterAll(async () => {
    await stopServer();
    await db?.destroy();
    cluster?.stop();
    fs.rmSync(tmp, { recursive: true, force: true });
    built?.remove();
  });

  it('when PostgreSQL restarts mid-load, then answers are 2xx or 503, it recovers, and no acknowledged write is lost', async () => {
    // The source is a JavaScript file with no TypeScript in it: what runs is the compiled server.
    expect(server.child.spawnargs.join(' ')).not.toMatch(/tsx|\.ts\b/);

    const register = await fetch(`${base}/api/auth/register`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'fault@example.org', password: 'a-long-password-1', name: 'Fault' }),
    });
    expect(register.status).toBe(201);
    cookie = register.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    const headers = { 'content-type': 'application/json', cookie };
    const bank = await fetch(`${base}/api/banks`, {
      method: 'POST',
      headers,
      body: JSON.stringify({ name: 'Fault bank' }),
    });
    expect(bank.status).toBe(201);
    const bankId: string = (await bank.json()).bank.id;
    const species = await (await fetch(`${base}/api/banks/${bankId}/species`, { headers })).json();
    const speciesId: string = species.items[0].id;

    const answers: Answer[] = [];
    const acknowledged = new Map<string, string>(); // lot code → id, for every 201
    let stopLoad = false;
    let next = 0;
    async function worker() {
      // Bounded in time (hardStop below) and in count.
      while (!stopLoad && next < 20_000) {
        const n = next++;
        const kind = n % 2 === 0 ? 'write' : 'read';
        const code = `F-${n}`;
        let answer: Answer;
        try {
          const res =
            kind === 'write'
              ? await fetch(`${base}/api/banks/${bankId}/lots`, {
                  method: 'POST',
                  headers,
                  body: JSON.stringify({
                    speciesId,
                    variety: `Load ${n}`,
                    origin: 'saved',
                    seedCount: 100,
                    code,
                    harvestDate: '2026-08-01',
                  }),
                })
              : await fetch(`${base}/api/banks/${bankId}/lots?limit=20`, { headers });
          const body = (await res.json().catch(() => ({}))) as {
            lot?: { id: string };
            error?: { code: string };
          };
          answer = { at: Date.now(), status: res.status, code: body.error?.code, kind };
          if (kind === 'write' && res.status === 201 && body.lot) acknowledged.set(code, body.lot.id);
        } catch {
          answer = { at: Date.now(), status: 0, kind };
        }
        answers.push(answer);
      }
    }
    progress = () =>
      JSON.stringify(
        answers.reduce<Record<string, number>>((counts, a) => {
          const key = `${a.kind} ${a.status} ${a.code ?? ''}`.trim();
          counts[key] = (counts[key] ?? 0) + 1;
          return counts;
        }, {}),
      ) + serverLog().slice(-2000);
    // The bound of the load: it stops by itself after this long whatever happens.
    const hardStop = setTimeout(() => (stopLoad = true), 180_000);
    const workers = Array.from({ length: 8 }, () => worker());
    try {
      await waitFor('writes acknowledged before the restart', () => acknowledged.size >= 20);

      // Fast shutdown: every session ends with 57P01, in-flight queries fail.
      const haltAt = Date.now();
      await cluster.halt();
      const downAt = Date.now();
      // Stay down until the server has answered a few requests with the database gone.
      await waitFor(
        'answers while the database is down',
        () => answers.filter((a) => a.at > downAt).length >= 16,
      );
      const resumeAt = Date.now();
      await cluster.resume();
      const backAt = Date.now();

      const recovered = await waitFor(
        'a 2xx after PostgreSQL is back',
        () => answers.find((a) => a.at > backAt && a.status >= 200 && a.status < 300),
        60_000,
      );
      // More load after recovery: it stays healthy.
      const recoveredWrites = acknowledged.size;
      await waitFor('writes acknowledged after the restart', () => acknowledged.size >= recoveredWrites + 20);
      stopLoad = true;
      await Promise.all(workers);

      // 0 process exits.
      expect(exits).toBe(0);
      expect(server.child.exitCode).toBeNull();
      // Every answer is 2xx or a 503 in the error shape naming the database (and none refused).
      const unexpected = answers.filter(
        (a) =>
          !(a.status >= 200 && a.status < 300) && !(a.status === 503 && a.code === 'database_unavailable'),
      );
      expect(unexpected, serverLog().slice(-3000)).toEqual([]);
      // The restart was seen: the answers while PostgreSQL was down were 503s.
      const whileDown = answers.filter((a) => a.at > downAt && a.at < resumeAt);
      expect(whileDown.length).toBeGreaterThan(0);
      expect(whileDown.every((a) => a.status === 503)).toBe(true);
      // Serving again within 10 s of PostgreSQL being back (in practice well under one second).
      expect(recovered.at - backAt).toBeLessThan(10_000);
      expect(haltAt).toBeLessThan(downAt);

      // Every acknowledged write is there, under its code.
      const rows = await db.selectFrom('lots').select(['id', 'code']).where('bank_id', '=', bankId).execute();
      const stored = new Map(rows.map((r) => [r.code, r.id]));
      const lost = [...acknowledged].filter(([code, id]) => stored.get(code) !== id);
      expect(acknowledged.size).toBeGreaterThanOrEqual(40);
      expect(lost).toEqual([]);
      // The server logged the lost connections as warnings, not as crashes.
      expect(serverLog()).not.toMatch(/uncaught exception/);
    } finally {
      stopLoad = true;
      clearTimeout(hardStop);
      await Promise.all(workers);
    }
  }, 300_000);

  it('when the server starts while PostgreSQL is down, then it answers 503 and serves by itself once it is up', async () => {
    await stopServer();
    await cluster.halt();
    await launch();
    const me = () => fetch(`${base}/api/me`, { headers: { cookie } });
    const down = await me();
    expect(down.status).toBe(503);
    expect((await down.json()).error.code).toBe('database_unavailable');

    await cluster.resume();
    const backAt = Date.now();
    let status = 0;
    while (status !== 200 && !serverGone && Date.now() - backAt < 60_000) {
      status = (await me()).status;
      expect([200, 503]).toContain(status);
      if (status !== 200) await new Promise((r) => setTimeout(r, 100));
    }
    expect(status).toBe(200);
    expect(Date.now() - backAt).toBeLessThan(10_000);
    expect(exits).toBe(0);
  }, 180_000);
});
