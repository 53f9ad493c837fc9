import crypto from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '#server/config';
import { AppError } from '#server/http/errors';
import { processPhoto, type ProcessedPhoto } from '#server/photos/process-photo';
import { photoKeys, removePhotoObjects, storeProcessedPhoto } from '#server/photos/store-photo';
import { createObjectStore, type ObjectStore } from '#server/storage/object-store';
import { jpeg } from '../helpers/images';

// Storing a processed photo in the object store that `npm test` starts (its address comes in the
// environment); processing alone, with no store, is tested in tests/unit/photos.test.ts.
describe('storing processed photos', () => {
  let storage: ObjectStore;
  let photo: ProcessedPhoto;
  const bankId = crypto.randomUUID();

  beforeAll(async () => {
    storage = createObjectStore(loadConfig().storage);
    photo = await processPhoto(await jpeg({ width: 1200, height: 900 }));
  });
  afterAll(() => storage.close());

  /** The real store, with its put failing from the `failFrom`-th call on (fault injection). */
  function failingPuts(failFrom: number): ObjectStore & { puts: string[] } {
    const puts: string[] = [];
    return {
      ...storage,
      puts,
      async put(key, body, contentType) {
        puts.push(key);
        if (puts.length >= failFrom)
          throw Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' });
        await storage.put(key, body, contentType);
      },
    };
  }

  it('when a photo is stored, then both objects sit under the bank and read back as WebP', async () => {
    const photoId = crypto.randomUUID();
    const keys = await storeProcessedPhoto(storage, bankId, photoId, photo);
    expect(keys).toEqual({
      fullKey: `banks/${bankId}/photos/${photoId}/full.webp`,
      thumbKey: `banks/${bankId}/photos/${photoId}/thumb.webp`,
    });
    const full = await storage.get(keys.fullKey);
    expect(full?.contentType).toBe('image/webp');
    full?.body.destroy();
    const fullBytes = await storage.getBuffer(keys.fullKey);
    const thumbBytes = await storage.getBuffer(keys.thumbKey);
    expect(fullBytes?.equals(photo.display.data)).toBe(true);
    expect(thumbBytes?.equals(photo.thumb.data)).toBe(true);
    const [fullMeta, thumbMeta] = await Promise.all([
      sharp(fullBytes!).metadata(),
      sharp(thumbBytes!).metadata(),
    ]);
    expect([fullMeta.format, fullMeta.width, fullMeta.height]).toEqual(['webp', 1200, 900]);
    // 900 × 320 / 1200 = 240 (computed).
    expect([thumbMeta.format, thumbMeta.width, thumbMeta.height]).toEqual(['webp', 320, 240]);
  });

  it('when the second put fails, then the first object is removed and a 503 is thrown', async () => {
    const photoId = crypto.randomUUID();
    const flaky = failingPuts(2);
    const error = await storeProcessedPhoto(flaky, bankId, photoId, photo).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(AppError);
    expect([(error as AppError).status, (error as AppError).code]).toEqual([503, 'service_unavailable']);
    expect((error as AppError).message).toBe(
      'Photo storage is not reachable right now; nothing was saved. Try again shortly.',
    );
    const { fullKey, thumbKey } = photoKeys(bankId, photoId);
    expect(flaky.puts).toEqual([fullKey, thumbKey]);
    expect(await storage.get(fullKey)).toBeNull();
    expect(await storage.get(thumbKey)).toBeNull();
  });

  it('when the object store cannot be reached at all, then a 503 is thrown', async () => {
    // A real store client pointed at a closed port on loopback.
    const down = createObjectStore({ ...loadConfig().storage, endpoint: 'http://127.0.0.1:9' });
    try {
      const error = await storeProcessedPhoto(down, bankId, crypto.randomUUID(), photo).catch(
        (e: unknown) => e,
      );
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).status).toBe(503);
    } finally {
      down.close();
    }
  });

  it('when photo objects are removed, then they are gone, and keys already missing are no error', async () => {
    const keys = await storeProcessedPhoto(storage, bankId, crypto.randomUUID(), photo);
    const neverStored = `banks/${bankId}/photos/${crypto.randomUUID()}/full.webp`;
    await removePhotoObjects(storage, [keys.fullKey, keys.thumbKey, neverStored]);
    expect(await storage.get(keys.fullKey)).toBeNull();
    expect(await storage.get(keys.thumbKey)).toBeNull();
    await expect(removePhotoObjects(storage, [keys.fullKey])).resolves.toBeUndefined();
  });
});
