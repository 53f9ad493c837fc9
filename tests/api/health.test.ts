import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { systemClock } from '#server/clock';
import { createDb } from '#server/db/database';
import { createMailer } from '#server/mail/mailer';
import { createObjectStore } from '#server/storage/object-store';
import { createTestContext, testConfig, type TestContext } from '../helpers/context';

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

describe('GET /api/health', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when every backing service is up, then it answers 200 with each part up', async () => {
    const res = await request(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ ok: true, database: 'up', objectStore: 'up', mail: 'up' });
  });

  it('when the object store is stopped, then it answers 503 with objectStore down', async () => {
    // An object-store fake of this test's own, so stopping it disturbs no other test.
    const port = await freePort();
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-s3-'));
    const s3 = new S3rver({
      address: '127.0.0.1',
      port,
      directory: dir,
      silent: true,
      configureBuckets: [{ name: 'hilum' }],
    });
    await s3.run();
    const config = testConfig({ databaseUrl: ctx.config.databaseUrl });
    const storage = createObjectStore({ ...config.storage, endpoint: `http://127.0.0.1:${port}` });
    const app = createApp({ config, db: ctx.db, storage, mailer: ctx.mailer, clock: systemClock });

    expect((await request(app).get('/api/health')).status).toBe(200);
    await s3.close();
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ ok: false, objectStore: 'down', database: 'up', mail: 'up' });
    storage.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('when the mail server is unreachable, then it answers 503 with mail down', async () => {
    const mailer = createMailer({ ...ctx.config.mail, port: await freePort() });
    const app = createApp({ ...ctx, mailer, clock: systemClock });
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ ok: false, mail: 'down', database: 'up', objectStore: 'up' });
  });

  it('when the database is unreachable, then it answers 503 with database down', async () => {
    const db = createDb(`postgres://hilum:x@127.0.0.1:${await freePort()}/none`, 1);
    const app = createApp({ ...ctx, db, clock: systemClock });
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ ok: false, database: 'down', objectStore: 'up', mail: 'up' });
    await db.destroy();
  });
});
