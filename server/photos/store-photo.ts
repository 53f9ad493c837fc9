import { z } from 'zod';
import { serviceDown } from '../http/errors';
import type { ObjectStore } from '../storage/object-store';
import type { ProcessedPhoto } from './process-photo';

const storageDown = () =>
  serviceDown('Photo storage is not reachable right now; nothing was saved. Try again shortly.');

/** Ids become parts of object keys, so they must be plain single path segments. */
const KeyPart = z.string().regex(/^[A-Za-z0-9][A-Za-z0-9_-]{0,127}$/, 'must be a plain id');

/** Where a photo's two images live: under its bank, so a bank's objects share one prefix. */
export function photoKeys(bankId: string, photoId: string): { fullKey: string; thumbKey: string } {
  const base = `banks/${KeyPart.parse(bankId)}/photos/${KeyPart.parse(photoId)}`;
  return { fullKey: `${base}/full.webp`, thumbKey: `${base}/thumb.webp` };
}

function isMissing(error: unknown): boolean {
  const name = (error as { name?: string } | null)?.name;
  return name === 'NoSuchKey' || name === 'NotFound';
}

/**
 * Stores both images of a processed photo. Either both are stored or neither is: when the second
 * put fails, the first object is deleted again. A store failure is a 503 AppError.
 */
export async function storeProcessedPhoto(
  storage: ObjectStore,
  bankId: string,
  photoId: string,
  photo: ProcessedPhoto,
): Promise<{ fullKey: string; thumbKey: string }> {
  const keys = photoKeys(bankId, photoId);
  try {
    await storage.put(keys.fullKey, photo.display.data, photo.display.contentType);
  } catch {
    throw storageDown();
  }
  try {
    await storage.put(keys.thumbKey, photo.thumb.data, photo.thumb.contentType);
  } catch {
    // Best effort: if the store is down this fails too, and the orphan is only a stray object.
    await storage.delete(keys.fullKey).catch(() => undefined);
    throw storageDown();
  }
  return keys;
}

/** Deletes a photo's objects; keys already gone count as deleted. Any other failure is a 503. */
export async function removePhotoObjects(storage: ObjectStore, keys: string[]): Promise<void> {
  const results = await Promise.allSettled(keys.map((key) => storage.delete(key)));
  if (results.some((result) => result.status === 'rejected' && !isMissing(result.reason))) {
    throw storageDown();
  }
}
