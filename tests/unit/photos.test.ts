import crypto from 'node:crypto';
import express from 'express';
import pino from 'pino';
import sharp from 'sharp';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { AppError, errorHandler } from '#server/http/errors';
import {
  MAX_INPUT_PIXELS,
  processPhoto,
  sniffImageType,
  type ProcessedPhoto,
} from '#server/photos/process-photo';
import { photoKeys } from '#server/photos/store-photo';
import { MAX_PHOTO_BYTES, singlePhoto } from '#server/photos/upload';
import {
  BACKGROUND,
  EXIF_TAG,
  MARKER,
  MARKER_SIZE,
  avif,
  bigUpload,
  gif,
  heicLikeBuffer,
  jpeg,
  jpegWithExif,
  near,
  pdfFile,
  pixelAt,
  png,
  pngBomb,
  readExif,
  svgFile,
  textFile,
  truncatedJpeg,
  webp,
  webpChunks,
} from '../helpers/images';

/** The AppError processPhoto rejects with (fails the test when it resolves or throws anything else). */
async function rejection(input: Buffer): Promise<AppError> {
  const error = await processPhoto(input).then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

/** The WebP signature: 'RIFF', a 4-byte size, 'WEBP' (RFC 9649 §2.5, the RIFF header; from memory). */
function isWebp(file: Buffer): boolean {
  return (
    file.subarray(0, 4).toString('latin1') === 'RIFF' && file.subarray(8, 12).toString('latin1') === 'WEBP'
  );
}

describe('processPhoto', () => {
  it('when a JPEG carries EXIF orientation 6 and GPS tags, then it comes out upright with no metadata', async () => {
    const input = await jpegWithExif({ orientation: 6, gps: true, width: 400, height: 200 });

    // The input really is a phone-style photo: EXIF with orientation 6, a GPS IFD and a profile.
    const inMeta = await sharp(input).metadata();
    expect([inMeta.width, inMeta.height]).toEqual([400, 200]);
    expect(inMeta.orientation).toBe(6);
    expect(inMeta.exif).toBeDefined();
    expect(inMeta.icc).toBeDefined();
    const tags = readExif(inMeta.exif as Buffer);
    expect(tags.ifd0.get(EXIF_TAG.Orientation)).toEqual([6]);
    expect(tags.gps.get(EXIF_TAG.GPSLatitudeRef)).toBe('N');
    expect(tags.gps.get(EXIF_TAG.GPSLatitude)).toEqual([12, 34, 56]);
    expect(tags.gps.get(EXIF_TAG.GPSLongitude)).toEqual([65, 43, 21]);
    // The marker sits in the top-left corner of the stored pixels.
    expect(near(await pixelAt(input, 10, 10), MARKER)).toBe(true);
    expect(near(await pixelAt(input, 389, 10), BACKGROUND)).toBe(true);

    const out = await processPhoto(input);
    expect(out.sourceFormat).toBe('jpeg');

    // Orientation 6: "the 0th row is the visual right-hand side of the image, and the 0th column
    // is the visual top" (Exif 2.32, CIPA DC-008, Orientation tag; from memory), i.e. the stored
    // pixels are turned 90° clockwise: 400 × 200 becomes 200 × 400 and the stored top-left corner
    // (row 0, column 0) becomes the visual top-right corner.
    expect([out.display.width, out.display.height]).toEqual([200, 400]);
    const outMeta = await sharp(out.display.data).metadata();
    expect([outMeta.width, outMeta.height]).toEqual([200, 400]);
    expect(near(await pixelAt(out.display.data, 200 - 10, 10), MARKER)).toBe(true);
    expect(near(await pixelAt(out.display.data, 200 - MARKER_SIZE - 10, 10), BACKGROUND)).toBe(true);
    expect(near(await pixelAt(out.display.data, 200 - 10, MARKER_SIZE + 10), BACKGROUND)).toBe(true);
    expect(near(await pixelAt(out.display.data, 10, 10), BACKGROUND)).toBe(true);
    expect(near(await pixelAt(out.display.data, 200 - 10, 400 - 10), BACKGROUND)).toBe(true);

    for (const image of [out.display, out.thumb]) {
      const meta = await sharp(image.data).metadata();
      expect(meta.format).toBe('webp');
      expect(meta.exif).toBeUndefined();
      expect(meta.orientation).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(meta.iptc).toBeUndefined();
      expect(meta.icc).toBeUndefined();
      // The container itself holds image data only: no EXIF, XMP or ICCP chunk (RFC 9649 §2.7,
      // extended file format chunk names; from memory).
      for (const chunk of webpChunks(image.data)) expect(['VP8 ', 'VP8L']).toContain(chunk);
      expect(image.data.includes(Buffer.from('Exif'))).toBe(false);
    }
    // Thumbnail: the whole photo scaled to a 320 px long edge, 400 → 320 and 200 → 160 (computed).
    expect([out.thumb.width, out.thumb.height]).toEqual([160, 320]);
    expect(near(await pixelAt(out.thumb.data, 160 - 5, 5), MARKER, 40)).toBe(true);
  });

  it('when a JPEG has no orientation tag, then its pixels keep their layout', async () => {
    const out = await processPhoto(await jpeg({ width: 400, height: 200 }));
    expect([out.display.width, out.display.height]).toEqual([400, 200]);
    expect(near(await pixelAt(out.display.data, 10, 10), MARKER)).toBe(true);
  });

  it('when a 3000 × 2000 JPEG is given, then the display image is 1600 × 1067 and the thumbnail 320 × 213', async () => {
    const out = await processPhoto(await jpeg({ width: 3000, height: 2000 }));
    // Long edge 1600: 2000 × 1600 / 3000 = 1066.67, which sharp rounds to 1067 (computed; rounding
    // observed with sharp 0.35.5). Thumbnail: 2000 × 320 / 3000 = 213.33 → 213 (computed).
    expect([out.display.width, out.display.height]).toEqual([1600, 1067]);
    expect([out.thumb.width, out.thumb.height]).toEqual([320, 213]);
    const meta = await sharp(out.display.data).metadata();
    expect([meta.width, meta.height]).toEqual([1600, 1067]);
    expect(out.display.contentType).toBe('image/webp');
    expect(out.thumb.contentType).toBe('image/webp');
  });

  it('when a photo is smaller than the display size, then it is not enlarged', async () => {
    const out = await processPhoto(await png({ width: 800, height: 600 }));
    expect([out.display.width, out.display.height]).toEqual([800, 600]);
    // 600 × 320 / 800 = 240 (computed).
    expect([out.thumb.width, out.thumb.height]).toEqual([320, 240]);
  });

  it('when PNG, WebP and AVIF photos are given, then each is accepted and stored as WebP', async () => {
    const inputs: [ProcessedPhoto['sourceFormat'], Buffer][] = [
      ['png', await png({ width: 640, height: 480 })],
      ['png', await png({ width: 640, height: 480, alpha: true })],
      ['webp', await webp({ width: 640, height: 480 })],
      ['avif', await avif({ width: 640, height: 480 })],
    ];
    for (const [format, input] of inputs) {
      const out = await processPhoto(input);
      expect(out.sourceFormat).toBe(format);
      expect([out.display.width, out.display.height]).toEqual([640, 480]);
      expect(isWebp(out.display.data)).toBe(true);
      expect(isWebp(out.thumb.data)).toBe(true);
      expect(near(await pixelAt(out.display.data, 10, 10), MARKER)).toBe(true);
    }
  });

  it('when a text file is given (whatever it is named), then it is refused with 415', async () => {
    const error = await rejection(textFile());
    expect(error.status).toBe(415);
    expect(error.code).toBe('unsupported_type');
    expect(error.message).toBe('Only JPEG, PNG, WebP or AVIF photos can be used.');
  });

  it('when a PDF or a GIF is given, then it is refused with 415', async () => {
    for (const input of [pdfFile(), await gif()]) {
      const error = await rejection(input);
      expect([error.status, error.code]).toEqual([415, 'unsupported_type']);
    }
  });

  it('when an SVG is given, then it is refused with 415 although sharp itself could render it', async () => {
    const svg = svgFile();
    expect((await sharp(svg).metadata()).format).toBe('svg');
    const error = await rejection(svg);
    expect([error.status, error.code]).toEqual([415, 'unsupported_type']);
  });

  it('when a HEIC photo is given, then it is refused with 415 and asked for as a JPEG', async () => {
    const heic = heicLikeBuffer();
    expect(sniffImageType(heic)).toBe('heic');
    const error = await rejection(heic);
    expect([error.status, error.code]).toEqual([415, 'unsupported_type']);
    expect(error.message).toMatch(/HEIC/);
    expect(error.message).toMatch(/choose a JPEG/i);
  });

  it('when a JPEG is truncated, then it is refused with 415 as unreadable although a lenient decoder accepts it', async () => {
    const truncated = await truncatedJpeg();
    // sharp with failOn 'none' decodes the cut-off file (grey fill for the missing rows).
    const lenient = await sharp(truncated, { failOn: 'none' }).png().toBuffer();
    expect((await sharp(lenient).metadata()).width).toBe(600);
    const error = await rejection(truncated);
    expect([error.status, error.code]).toEqual([415, 'unreadable_image']);
    expect(error.message).toMatch(/could not be read/);
  });

  it('when a file starts like a JPEG but is garbage, then it is refused with 415 as unreadable', async () => {
    const garbage = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), crypto.randomBytes(2000)]);
    const error = await rejection(garbage);
    expect([error.status, error.code]).toEqual([415, 'unreadable_image']);
  });

  it('when a small PNG declares 30000 × 30000 pixels, then it is refused with 415 before decoding', async () => {
    const bomb = pngBomb();
    expect(bomb.length).toBeLessThan(200_000);
    const header = await sharp(bomb, { limitInputPixels: false }).metadata();
    expect([header.width, header.height]).toEqual([30_000, 30_000]);
    expect(30_000 * 30_000).toBeGreaterThan(MAX_INPUT_PIXELS);
    const error = await rejection(bomb);
    expect([error.status, error.code]).toEqual([415, 'image_too_large']);
    expect(error.message).toMatch(/too many pixels/);
  });

  it('when a PNG has 64 megapixels (over our limit, under the library default), then it is refused with 415', async () => {
    // 8000 × 8000 = 64 000 000 pixels: above MAX_INPUT_PIXELS, below sharp's default limit of
    // 0x3FFF × 0x3FFF = 268 402 689 (sharp's SharpOptions.limitInputPixels documentation).
    const big = pngBomb(8000);
    expect(8000 * 8000).toBeGreaterThan(MAX_INPUT_PIXELS);
    expect((await sharp(big).metadata()).width).toBe(8000);
    const error = await rejection(big);
    expect([error.status, error.code]).toEqual([415, 'image_too_large']);
  });

  it('when the input is empty, then it is refused with 415', async () => {
    const error = await rejection(Buffer.alloc(0));
    expect([error.status, error.code]).toEqual([415, 'unsupported_type']);
  });
});

describe('photo keys', () => {
  const bankId = crypto.randomUUID();

  it('when an id could escape its key prefix, then no key is made', () => {
    expect(() => photoKeys('../other-bank', 'p1')).toThrow();
    expect(() => photoKeys(bankId, 'a/b')).toThrow();
    expect(() => photoKeys(bankId, '')).toThrow();
  });
});

describe('singlePhoto upload middleware', () => {
  const app = express();
  app.post('/photo', singlePhoto(), (req, res) => {
    res.json({ size: req.file?.size, field: req.file?.fieldname });
  });
  app.use(errorHandler(pino({ level: 'silent' })));

  it('when a photo is sent in the field "photo", then the handler gets its bytes', async () => {
    const body = await jpeg();
    const res = await request(app).post('/photo').attach('photo', body, 'packet.jpg');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ size: body.length, field: 'photo' });
  });

  it('when no file is sent, then the answer is 400 asking for a photo', async () => {
    const res = await request(app).post('/photo').field('note', 'no file here');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('Choose a photo to upload.');
  });

  it('when the file is larger than 15 MiB, then the answer is 413', async () => {
    const res = await request(app)
      .post('/photo')
      .attach('photo', await bigUpload(MAX_PHOTO_BYTES + 1), 'huge.jpg');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });

  it('when a file of exactly 15 MiB is sent, then it is received', async () => {
    const res = await request(app)
      .post('/photo')
      .attach('photo', await bigUpload(MAX_PHOTO_BYTES), 'large.jpg');
    expect(res.status).toBe(200);
    expect(res.body.size).toBe(MAX_PHOTO_BYTES);
  });

  it('when two files are sent, then the answer is 400', async () => {
    const res = await request(app)
      .post('/photo')
      .attach('photo', await jpeg(), 'a.jpg')
      .attach('photo', await jpeg(), 'b.jpg');
    expect(res.status).toBe(400);
  });
});
