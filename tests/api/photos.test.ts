import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { createObjectStore } from '#server/storage/object-store';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import {
  bigUpload,
  heicLikeBuffer,
  jpegWithExif,
  pngBomb,
  svgFile,
  textFile,
  truncatedJpeg,
} from '../helpers/images';
import { speciesId } from '../helpers/lots';

/** Every object file the object-store fake holds for one bank. */
function objectsOfBank(s3Dir: string, bankId: string): string[] {
  const dir = path.join(s3Dir, 'hilum', 'banks', bankId);
  if (!fs.existsSync(dir)) return [];
  // s3rver keeps each object as a data file plus a metadata file; count the data files.
  return (fs.readdirSync(dir, { recursive: true }) as string[]).filter((f) => f.endsWith('._S3rver_object'));
}

describe('packet photos through the API', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let lotId: string;
  const s3Dir = process.env.HILUM_S3_DIR!;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: await speciesId(ctx.db, 'tomato'),
      variety: 'Photo lot',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 50,
    });
    lotId = lot.body.lot.id;
  });
  afterAll(() => ctx.close());
  const upload = (file: Buffer, name: string, agent = bank.grower.agent) =>
    agent.post(`/api/banks/${bank.bankId}/lots/${lotId}/photos`).attach('photo', file, name);
  const photoRows = () =>
    ctx.db.selectFrom('photos').select('id').where('bank_id', '=', bank.bankId).execute();

  it('when a phone JPEG with orientation 6 and GPS is uploaded, then it comes back upright with no metadata', async () => {
    const input = await jpegWithExif({ orientation: 6, gps: true, width: 400, height: 200 });
    const meta = await sharp(input).metadata();
    expect(meta.orientation).toBe(6);
    expect(meta.exif).toBeDefined();

    const res = await upload(input, 'IMG_0001.jpg');
    expect(res.status).toBe(201);
    // Exif 2.32, tag 0x0112 value 6: the stored image must be turned 90° clockwise to view (from memory).
    expect(res.body.photo).toMatchObject({ width: 200, height: 400 });
    const full = await bank.viewer.agent
      .get(res.body.photo.url)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(full.status).toBe(200);
    expect(full.headers['content-type']).toBe('image/webp');
    expect(full.headers['cache-control']).toMatch(/private/);
    const out = await sharp(full.body as Buffer).metadata();
    expect(out).toMatchObject({ format: 'webp', width: 200, height: 400 });
    expect(out.exif).toBeUndefined();
    expect(out.orientation).toBeUndefined();
    expect((full.body as Buffer).includes(Buffer.from('GPS'))).toBe(false);

    const thumb = await bank.viewer.agent.get(res.body.photo.thumbUrl);
    expect(thumb.status).toBe(200);
  });

  it.each([
    ['a text file named .jpg', () => Promise.resolve(textFile()), 'packet.jpg'],
    ['a truncated JPEG', () => truncatedJpeg(), 'cut.jpg'],
    ['an SVG', () => Promise.resolve(svgFile()), 'packet.svg'],
    ['a HEIC photo', () => Promise.resolve(heicLikeBuffer()), 'IMG_0002.heic'],
    ['a PNG declaring 30000×30000 pixels', () => Promise.resolve(pngBomb()), 'bomb.png'],
  ])('when %s is uploaded, then it is 415 and no row or object is left', async (_what, make, name) => {
    const rowsBefore = (await photoRows()).length;
    const objectsBefore = objectsOfBank(s3Dir, bank.bankId).length;
    const res = await upload(await make(), name);
    expect(res.status).toBe(415);
    expect(res.body.error.message.length).toBeGreaterThan(10);
    expect((await photoRows()).length).toBe(rowsBefore);
    expect(objectsOfBank(s3Dir, bank.bankId).length).toBe(objectsBefore);
  });

  it('when the type is wrong, then the message says which types work', async () => {
    const res = await upload(svgFile(), 'packet.svg');
    expect(res.body.error.message).toMatch(/JPEG, PNG, WebP or AVIF/);
  });

  it('when the upload is 16 MB, then it is 413', async () => {
    const res = await upload(await bigUpload(16 * 1024 * 1024), 'huge.jpg');
    expect(res.status).toBe(413);
  });

  it('when a viewer uploads, then it is 403', async () => {
    expect((await upload(await jpegWithExif(), 'x.jpg', bank.viewer.agent)).status).toBe(403);
  });

  it('when someone outside the bank asks for a photo, then it is 404', async () => {
    const res = await upload(await jpegWithExif(), 'x.jpg');
    expect((await bank.outsider.agent.get(res.body.photo.url)).status).toBe(404);
  });

  it('when someone signed out asks for a photo, then it is 401', async () => {
    const res = await upload(await jpegWithExif(), 'x.jpg');
    expect((await request(ctx.app).get(res.body.photo.url)).status).toBe(401);
  });

  it('when a photo is deleted, then its objects are removed from the store', async () => {
    const res = await upload(await jpegWithExif(), 'x.jpg');
    const before = objectsOfBank(s3Dir, bank.bankId).length;
    expect(
      (await bank.grower.agent.delete(`/api/banks/${bank.bankId}/photos/${res.body.photo.id}`)).status,
    ).toBe(204);
    expect(objectsOfBank(s3Dir, bank.bankId).length).toBe(before - 2);
    expect((await bank.viewer.agent.get(res.body.photo.url)).status).toBe(404);
  });

  it('when the object store is down, then upload is 503 and no row exists', async () => {
    // An object store of this test's own, stopped, so the shared fake keeps serving other tests.
    const port = await new Promise<number>((resolve) => {
      const s = net.createServer().listen(0, '127.0.0.1', () => {
        const { port: p } = s.address() as net.AddressInfo;
        s.close(() => resolve(p));
      });
    });
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-s3-down-'));
    const s3 = new S3rver({
      address: '127.0.0.1',
      port,
      directory: dir,
      silent: true,
      configureBuckets: [{ name: 'hilum' }],
    });
    await s3.run();
    await s3.close();
    const storage = createObjectStore({ ...ctx.config.storage, endpoint: `http://127.0.0.1:${port}` });
    const app = createApp({ ...ctx, storage });
    const rowsBefore = (await photoRows()).length;
    const agent = request.agent(app);
    await agent.post('/api/auth/login').send({ email: bank.grower.email, password: 'correct horse battery' });
    const res = await agent
      .post(`/api/banks/${bank.bankId}/lots/${lotId}/photos`)
      .attach('photo', await jpegWithExif(), 'x.jpg');
    expect(res.status).toBe(503);
    expect((await photoRows()).length).toBe(rowsBefore);
    storage.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });
});
