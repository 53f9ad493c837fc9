import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { createTestContext, type TestContext } from '../helpers/context';
import { PASSWORD, signUp, uniqueEmail } from '../helpers/accounts';
import { listening, postFrom, type Answer } from '../helpers/from-address';

// The limits under test (server/http/rate-limit.ts): sign-in 5 failures per account and address
// and 50 per address in 15 minutes; sign-up 100 an hour per address; reset request 3 an hour per
// e-mail; reset confirm 20 in 15 minutes per address. Each test sends from a loopback address of
// its own (127.0.0.0/8 is all this machine), so their counts stay apart.
const WRONG = 'not the right password';
const FIFTEEN_MINUTES_S = 15 * 60;

/** A 429 in the error shape that says when to come back, within the window. */
function expectRefused(answer: Answer | request.Response) {
  expect(answer.status).toBe(429);
  expect(answer.body.error?.code).toBe('rate_limited');
  const retryAfter = Number(answer.headers['retry-after']);
  expect(Number.isInteger(retryAfter)).toBe(true);
  expect(retryAfter).toBeGreaterThanOrEqual(1);
  expect(retryAfter).toBeLessThanOrEqual(60 * 60);
  return retryAfter;
}

describe('rate limits on signing in and the routes around it', () => {
  let ctx: TestContext;
  /** A second app server on the same database, as behind a load balancer. */
  let second: ReturnType<typeof createApp>;
  let servers: Awaited<ReturnType<typeof listening>>[];
  let one: number;
  let two: number;
  beforeAll(async () => {
    ctx = await createTestContext();
    second = createApp({ ...ctx });
    servers = [await listening(ctx.app), await listening(second)];
    [one, two] = servers.map((s) => s.port) as [number, number];
  });
  afterAll(async () => {
    for (const server of servers) await server.close();
    await ctx.close();
  });

  it('when sign-in fails on two servers in turn, then they count together and the sixth is 429', async () => {
    const { email } = await signUp(ctx.app);
    const from = '127.0.0.11';
    const statuses = [];
    for (const port of [one, two, one, two, one]) {
      statuses.push((await postFrom(port, from, '/api/auth/login', { email, password: WRONG })).status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401]);
    const retryAfter = expectRefused(
      await postFrom(two, from, '/api/auth/login', { email, password: PASSWORD }),
    );
    expect(retryAfter).toBeLessThanOrEqual(FIFTEEN_MINUTES_S);
  });

  it("when someone elsewhere guesses the owner's password, then only that address is refused and the owner signs in", async () => {
    const owner = await signUp(ctx.app);
    const attacker = '127.0.0.12';
    for (let i = 0; i < 5; i++) {
      const guess = await postFrom(one, attacker, '/api/auth/login', { email: owner.email, password: WRONG });
      expect(guess.status).toBe(401);
    }
    expectRefused(await postFrom(two, attacker, '/api/auth/login', { email: owner.email, password: WRONG }));
    // Even the right password is refused from there, until the window ends …
    expectRefused(
      await postFrom(one, attacker, '/api/auth/login', { email: owner.email, password: PASSWORD }),
    );
    // … but the owner, from their own address, signs in on either server.
    for (const port of [one, two]) {
      const own = await postFrom(port, '127.0.0.13', '/api/auth/login', {
        email: owner.email,
        password: PASSWORD,
      });
      expect(own.status).toBe(200);
      expect(String(own.headers['set-cookie'])).toMatch(/^hilum_session=/);
    }
    // The attacker's address is refused for this account only: another account still answers 401.
    const other = await signUp(ctx.app);
    expect(
      (await postFrom(one, attacker, '/api/auth/login', { email: other.email, password: WRONG })).status,
    ).toBe(401);
  });

  it('when one address tries many accounts, then past 50 failures it is refused for all, and other addresses are not', async () => {
    const { email } = await signUp(ctx.app);
    const sprayer = '127.0.0.14';
    for (let i = 0; i < 50; i++) {
      const port = i % 2 ? one : two;
      const tried = await postFrom(port, sprayer, '/api/auth/login', {
        email: uniqueEmail('sprayed'),
        password: WRONG,
      });
      expect(tried.status, `attempt ${i + 1}`).toBe(401);
    }
    expectRefused(await postFrom(one, sprayer, '/api/auth/login', { email, password: PASSWORD }));
    expect((await postFrom(two, '127.0.0.15', '/api/auth/login', { email, password: PASSWORD })).status).toBe(
      200,
    );
  });

  it('when a person signs in successfully between failures, then the successes use none of the allowance', async () => {
    const { email } = await signUp(ctx.app);
    const from = '127.0.0.16';
    const statuses = [];
    for (let i = 0; i < 4; i++) {
      statuses.push((await postFrom(one, from, '/api/auth/login', { email, password: WRONG })).status);
    }
    for (let i = 0; i < 6; i++) {
      const port = i % 2 ? one : two;
      statuses.push((await postFrom(port, from, '/api/auth/login', { email, password: PASSWORD })).status);
    }
    statuses.push((await postFrom(two, from, '/api/auth/login', { email, password: WRONG })).status);
    expect(statuses).toEqual([401, 401, 401, 401, 200, 200, 200, 200, 200, 200, 401]);
    expectRefused(await postFrom(one, from, '/api/auth/login', { email, password: PASSWORD }));
  });

  it('when the window has passed, then the refused pair may sign in again', async () => {
    const { email } = await signUp(ctx.app);
    const from = '127.0.0.17';
    for (let i = 0; i < 5; i++) await postFrom(one, from, '/api/auth/login', { email, password: WRONG });
    const retryAfter = expectRefused(
      await postFrom(two, from, '/api/auth/login', { email, password: PASSWORD }),
    );
    ctx.clock.set(new Date(ctx.clock.now().getTime() + (retryAfter - 2) * 1000));
    expectRefused(await postFrom(one, from, '/api/auth/login', { email, password: PASSWORD }));
    ctx.clock.set(new Date(ctx.clock.now().getTime() + 3 * 1000));
    expect((await postFrom(two, from, '/api/auth/login', { email, password: PASSWORD })).status).toBe(200);
  });

  it('when sign-ups come through two servers, then the 101st in an hour from one address is 429', async () => {
    // The other tests run with a larger sign-up limit (tests/helpers/context.ts); these two servers
    // run with the one production has.
    const [a, b] = await Promise.all(
      [createApp({ ...ctx, signUpLimit: undefined }), createApp({ ...ctx, signUpLimit: undefined })].map(
        listening,
      ),
    );
    try {
      const from = '127.0.0.18';
      for (let i = 0; i < 100; i++) {
        // Refused bodies count too: the limit runs before the body is read.
        const answer = await postFrom(i % 2 ? a!.port : b!.port, from, '/api/auth/register', {
          email: 'not an address',
        });
        expect(answer.status, `sign-up ${i + 1}`).toBe(400);
      }
      const body = () => ({ email: uniqueEmail(), password: PASSWORD, name: 'Late' });
      expectRefused(await postFrom(a!.port, from, '/api/auth/register', body()));
      expect((await postFrom(b!.port, '127.0.0.19', '/api/auth/register', body())).status).toBe(201);
    } finally {
      await Promise.all([a!.close(), b!.close()]);
    }
  });

  it('when resets for one e-mail are asked through two servers, then the fourth in an hour is 429', async () => {
    const email = uniqueEmail('reset');
    const statuses = [];
    for (const [port, from] of [
      [one, '127.0.0.20'],
      [two, '127.0.0.21'],
      [one, '127.0.0.22'],
    ] as const) {
      statuses.push((await postFrom(port, from, '/api/auth/password-reset', { email })).status);
    }
    expect(statuses).toEqual([202, 202, 202]);
    // Per e-mail: a fourth address does not help.
    expectRefused(await postFrom(two, '127.0.0.23', '/api/auth/password-reset', { email }));
  });

  it('when reset links are tried through two servers, then the 21st try in 15 minutes is 429', async () => {
    const from = '127.0.0.24';
    for (let i = 0; i < 20; i++) {
      const port = i % 2 ? one : two;
      const tried = await postFrom(port, from, '/api/auth/password-reset/confirm', {
        token: `made-up-token-${i}`,
        password: 'a brand new password',
      });
      expect(tried.status, `try ${i + 1}`).toBe(400);
      expect(tried.body.error?.code).toBe('invalid_token');
    }
    expectRefused(
      await postFrom(one, from, '/api/auth/password-reset/confirm', {
        token: 'made-up-token-20',
        password: 'a brand new password',
      }),
    );
  });

  it('when the counters are stored, then they hold neither an e-mail nor an address', async () => {
    const rows = await ctx.db.selectFrom('rate_limits').selectAll().execute();
    expect(rows.length).toBeGreaterThan(10);
    for (const row of rows) expect(row.key).toMatch(/^[0-9a-f]{64}$/);
  });
});

describe('the client address behind a proxy', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when TRUST_PROXY is unset, then X-Forwarded-For is ignored and a new one each time does not reset the count', async () => {
    expect(ctx.config.trustProxy).toBe(false);
    const { email } = await signUp(ctx.app);
    const statuses = [];
    for (let i = 1; i <= 5; i++) {
      const res = await request(ctx.app)
        .post('/api/auth/login')
        .set('X-Forwarded-For', `203.0.113.${i}`)
        .send({ email, password: WRONG });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401]);
    expectRefused(
      await request(ctx.app)
        .post('/api/auth/login')
        .set('X-Forwarded-For', '198.51.100.4')
        .send({ email, password: PASSWORD }),
    );
  });

  it('when TRUST_PROXY names the proxy, then its X-Forwarded-For names the client, and nobody else’s does', async () => {
    // The proxy is 127.0.0.31; 127.0.0.32 is a client that is not one.
    const app = createApp({ ...ctx, config: { ...ctx.config, trustProxy: ['127.0.0.31'] } });
    const server = await listening(app);
    try {
      const { email } = await signUp(ctx.app);
      const viaProxy = (client: string, password: string) =>
        postFrom(
          server.port,
          '127.0.0.31',
          '/api/auth/login',
          { email, password },
          { 'x-forwarded-for': client },
        );
      for (let i = 0; i < 5; i++) expect((await viaProxy('203.0.113.7', WRONG)).status).toBe(401);
      expectRefused(await viaProxy('203.0.113.7', PASSWORD));
      // The owner, behind the same proxy from another address, is not locked out.
      expect((await viaProxy('198.51.100.4', PASSWORD)).status).toBe(200);

      // Straight from a client that is not the proxy, X-Forwarded-For names nobody.
      const direct = (client: string) =>
        postFrom(
          server.port,
          '127.0.0.32',
          '/api/auth/login',
          { email, password: WRONG },
          {
            'x-forwarded-for': client,
          },
        );
      for (let i = 1; i <= 5; i++) expect((await direct(`192.0.2.${i}`)).status).toBe(401);
      expectRefused(await direct('192.0.2.99'));
    } finally {
      await server.close();
    }
  });
});
