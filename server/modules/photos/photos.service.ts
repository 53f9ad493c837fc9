import crypto from 'node:crypto';
import type { Readable } from 'node:stream';
import type { Logger } from 'pino';
import type { PhotoDto } from '#shared/schemas/lots';
import { systemClock, type Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import type { PhotoSubject } from '#server/db/schema';
import { AppError, notFound } from '#server/http/errors';
import { processPhoto } from '#server/photos/process-photo';
import { photoKeys, removePhotoObjects, storeProcessedPhoto } from '#server/photos/store-photo';
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

/** A photo's subject as a route names it: a tray also by the test it belongs to. */
export interface SubjectRef {
  bankId: string;
  subject: PhotoSubject;
  subjectId: string;
  testId?: string;
}

/**
 * How long an upload may take between queueing its objects' keys and writing its row; a key queued
 * longer ago belongs to an upload that failed or died, and its objects are swept.
 */
export const UPLOAD_GRACE_MS = 15 * 60 * 1000;

export function createPhotosService({
  db,
  storage,
  clock = systemClock,
  logger,
}: {
  db: Db;
  storage: ObjectStore;
  clock?: Clock;
  logger?: Logger;
}) {
  async function requireSubject(ref: SubjectRef) {
    const found = await repo.findSubjectInBank(db, ref.bankId, ref.subject, ref.subjectId, ref.testId);
    if (!found) throw notFound(`No such ${ref.subject} in this bank.`);
  }

  /**
   * Deletes queued objects: those of `keys`, or with none given every one queued longer ago than
   * an upload may take. What the store refuses now stays queued for the next try.
   */
  async function drainDeletions(keys?: string[]) {
    if (keys && keys.length === 0) return;
    const pending = await repo.queuedDeletions(
      db,
      keys ? { keys } : { queuedBefore: new Date(clock.now().getTime() - UPLOAD_GRACE_MS) },
    );
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

    /** The subject's photos; a subject not in the bank (or a tray not of that test) is a 404. */
    async list(ref: SubjectRef) {
      await requireSubject(ref);
      const rows = await repo.listSubjectPhotos(db, ref.bankId, ref.subject, ref.subjectId);
      return rows.map(toDto);
    },

    /**
     * Checks, processes and stores a photo. Its object keys are queued for deletion before the
     * first put and taken off the queue in the transaction that writes its row: an upload that
     * fails or dies halfway (the store going down between the two puts, the database before the
     * row) leaves no object without a row, as the queue removes them once the store answers again;
     * and no row is written before both objects are stored.
     */
    async upload(ref: SubjectRef, userId: string, input: Buffer) {
      await requireSubject(ref);
      const { bankId, subject, subjectId } = ref;
      const processed = await processPhoto(input);
      const photoId = crypto.randomUUID();
      const { fullKey, thumbKey } = photoKeys(bankId, photoId);
      await repo.queueDeletions(db, [fullKey, thumbKey], clock.now());
      let row;
      try {
        await storeProcessedPhoto(storage, bankId, photoId, processed);
        row = await db.transaction().execute(async (trx) => {
          const inserted = await repo.insertPhoto(trx, {
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
          await repo.dropQueuedDeletions(trx, [fullKey, thumbKey]);
          return inserted;
        });
      } catch (error) {
        // Best effort now; whatever stays queued is swept after UPLOAD_GRACE_MS.
        await drainDeletions([fullKey, thumbKey]).catch(() => undefined);
        throw error;
      }
      // The store has just answered: a good moment to sweep what earlier uploads left behind.
      await drainDeletions().catch((error: unknown) => logger?.warn({ err: error }, 'sweep failed'));
      return toDto(row);
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
