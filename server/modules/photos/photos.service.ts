import crypto from 'node:crypto';
import type { Readable } from 'node:stream';
import type { Logger } from 'pino';
import type { PhotoDto } from '#shared/schemas/lots';
import type { Db, DbOrTx } from '#server/db/database';
import type { PhotoSubject } from '#server/db/schema';
import { AppError, notFound } from '#server/http/errors';
import { processPhoto } from '#server/photos/process-photo';
import { removePhotoObjects, storeProcessedPhoto } from '#server/photos/store-photo';
import type { ObjectStore } from '#server/storage/object-store';
import * as repo from './photos.repository';

function toDto(row: { id: string; width: number; height: number; created_at: Date }): PhotoDto {
  return {
    id: row.id,
    url: `/api/photos/${row.id}?size=full`,
    thumbUrl: `/api/photos/${row.id}?size=thumb`,
    width: row.width,
    height: row.height,
    createdAt: row.created_at.toISOString(),
  };
}

export function createPhotosService({
  db,
  storage,
  logger,
}: {
  db: Db;
  storage: ObjectStore;
  logger?: Logger;
}) {
  /** Deletes objects whose rows are gone; what the store refuses now stays queued for later. */
  async function drainDeletions(keys?: string[]) {
    if (keys && keys.length === 0) return;
    const pending = await repo.queuedDeletions(db, keys);
    if (pending.length === 0) return;
    try {
      await removePhotoObjects(storage, pending);
      await repo.dropQueuedDeletions(db, pending);
    } catch (error) {
      logger?.warn({ err: error, keys: pending.length }, 'object deletions left queued');
    }
  }

  /** Removes a subject's photo rows inside `trx` and queues their objects; call the result after commit. */
  async function removeSubjectPhotos(trx: DbOrTx, bankId: string, subject: PhotoSubject, subjectId: string) {
    const rows = await repo.deleteSubjectPhotos(trx, bankId, subject, subjectId);
    const keys = rows.flatMap((r) => [r.full_key, r.thumb_key]);
    if (keys.length) {
      await repo.queueDeletions(trx, keys);
    }
    return () => drainDeletions(keys);
  }

  return {
    drainDeletions,
    removeSubjectPhotos,

    async photosOf(on: DbOrTx, subject: PhotoSubject, subjectIds: string[]) {
      const map = new Map<string, PhotoDto[]>();
      if (subjectIds.length === 0) return map;
      const rows = await repo.photosOfSubjects(on, subject, subjectIds);
      for (const row of rows) map.set(row.subject_id, [...(map.get(row.subject_id) ?? []), toDto(row)]);
      return map;
    },

    async list(bankId: string, subject: PhotoSubject, subjectId: string) {
      const rows = await repo.listSubjectPhotos(db, bankId, subject, subjectId);
      return rows.map(toDto);
    },

    /** Checks, processes and stores a photo; the row is written only once both objects are stored. */
    async upload(bankId: string, subject: PhotoSubject, subjectId: string, userId: string, input: Buffer) {
      const owner = await repo.findSubjectInBank(db, bankId, subject, subjectId);
      if (!owner) throw notFound(`No such ${subject} in this bank.`);
      const processed = await processPhoto(input);
      const photoId = crypto.randomUUID();
      const { fullKey, thumbKey } = await storeProcessedPhoto(storage, bankId, photoId, processed);
      try {
        const row = await repo.insertPhoto(db, {
          id: photoId,
          bank_id: bankId,
          subject,
          subject_id: subjectId,
          full_key: fullKey,
          thumb_key: thumbKey,
          width: processed.display.width,
          height: processed.display.height,
          bytes: processed.display.data.length + processed.thumb.data.length,
          created_by: userId,
        });
        return toDto(row);
      } catch (error) {
        await removePhotoObjects(storage, [fullKey, thumbKey]).catch(() => undefined);
        throw error;
      }
    },

    async remove(bankId: string, photoId: string) {
      const keys = await db.transaction().execute(async (trx) => {
        const row = await repo.deletePhoto(trx, bankId, photoId);
        if (!row) throw notFound('No such photo in this bank.');
        const list = [row.full_key, row.thumb_key];
        await repo.queueDeletions(trx, list);
        return list;
      });
      await drainDeletions(keys);
    },

    /** The image for a member of the photo's bank; anyone else gets the same 404 as a missing photo. */
    async open(
      photoId: string,
      userId: string,
      size: 'full' | 'thumb',
    ): Promise<{ body: Readable; length?: number }> {
      const row = await repo.findPhotoForMember(db, photoId, userId);
      if (!row) throw notFound('No such photo.');
      let object;
      try {
        object = await storage.get(size === 'full' ? row.full_key : row.thumb_key);
      } catch {
        throw new AppError(503, 'service_unavailable', 'Photo storage is not reachable right now.');
      }
      if (!object) throw notFound('No such photo.');
      return { body: object.body, length: object.contentLength };
    },
  };
}

export type PhotosService = ReturnType<typeof createPhotosService>;
