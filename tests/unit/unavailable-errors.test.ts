// The error handler's mapping of a backing service that does not answer to a 503 in the error
// shape, on the real errors of the real clients (pg, the S3 SDK, nodemailer) aimed at a loopback
// port where nothing listens. The restart of a live PostgreSQL is tests/api/db-restart.test.ts.
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import pino from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createDb } from '#server/db/database';
import { errorHandler, unavailableService } from '#server/http/errors';
import { createMailer } from '#server/mail/mailer';
import { createObjectStore } from '#server/storage/object-store';

async function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function failure(run: () => Promise<unknown>): Promise<unknown> {
  try {
    await run();
  } catch (error) {
    return error;
  }
  throw new Error('expected a failure');
}

/** What the app answers when a route fails with `error`. */
async function answerFor(error: unknown) {
  const app = express();
  app.get('/x', () => {
    throw error;
  });
  app.use(errorHandler(pino({ level: 'silent' })));
  const res = await request(app).get('/x');
  return { status: res.status, body: res.body };
}

describe('a backing service that does not answer', () => {
  it('when PostgreSQL refuses the connection, then the answer is 503 database_unavailable', async () => {
    const db = createDb(`postgres://hilum:x@127.0.0.1:${await closedPort()}/none`, 1);
    const error = await failure(() => db.selectFrom('users').select('id').execute());
    await db.destroy();
    expect(await answerFor(error)).toEqual({
      status: 503,
      body: {
        error: {
          code: 'database_unavailable',
          message: 'The database is restarting; try again in a moment.',
        },
      },
    });
  });

  it('when the PostgreSQL socket file is gone (a local cluster stopped), then it is 503 database_unavailable', async () => {
    const socketDir = path.join(os.tmpdir(), `hilum-no-socket-${process.pid}`);
    const db = createDb(`postgres://hilum:x@127.0.0.1:5432/none?host=${encodeURIComponent(socketDir)}`, 1);
    const error = await failure(() => db.selectFrom('users').select('id').execute());
    await db.destroy();
    expect(unavailableService(error)?.code).toBe('database_unavailable');
  });

  it('when the object store is down, then the answer is 503 storage_unavailable', async () => {
    const storage = createObjectStore({
      endpoint: `http://127.0.0.1:${await closedPort()}`,
      region: 'us-east-1',
      bucket: 'hilum',
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
    });
    const error = await failure(() => storage.get('any/key'));
    storage.close();
    const answer = await answerFor(error);
    expect(answer.status).toBe(503);
    expect(answer.body.error.code).toBe('storage_unavailable');
  });

  it('when the mail server is down, then the answer is 503 mail_unavailable', async () => {
    const mailer = createMailer({
      host: '127.0.0.1',
      port: await closedPort(),
      secure: false,
      user: undefined,
      password: undefined,
      from: 'Hilum <no-reply@hilum.test>',
    });
    const error = await failure(() => mailer.send({ to: 'a@example.org', subject: 's', text: 't' }));
    mailer.close();
    const answer = await answerFor(error);
    expect(answer.status).toBe(503);
    expect(answer.body.error.code).toBe('mail_unavailable');
  });

  it('when an error is not about a backing service, then it stays a 500 internal', async () => {
    expect(unavailableService(new Error('a bug'))).toBeNull();
    expect((await answerFor(new TypeError('x is undefined'))).status).toBe(500);
  });
});
