import type { Insertable } from 'kysely';
import type { DbOrTx } from '#server/db/database';
import type { PhotoSubject, PhotoTable } from '#server/db/schema';

const SUBJECT_TABLE = { lot: 'lots', plant: 'parent_plants' } as const;

/** Up to 500 queued object keys: of `keys`, or else those queued before `queuedBefore`. */
export async function queuedDeletions(
  db: DbOrTx,
  which: { keys: string[] } | { queuedBefore: Date },
): Promise<string[]> {
  let q = db.selectFrom('object_deletions').select('key');
  q = 'keys' in which ? q.where('key', 'in', which.keys) : q.where('created_at', '<', which.queuedBefore);
  return (await q.limit(500).execute()).map((r) => r.key);
}

export const dropQueuedDeletions = (db: DbOrTx, keys: string[]) =>
  db.deleteFrom('object_deletions').where('key', 'in', keys).execute();

export const queueDeletions = (db: DbOrTx, keys: string[], at?: Date) =>
  db
    .insertInto('object_deletions')
    .values(keys.map((key) => (at ? { key, created_at: at } : { key })))
    .onConflict((oc) => oc.doNothing())
    .execute();

/** Deletes a subject's photo rows, returning their object keys. */
export const deleteSubjectPhotos = (db: DbOrTx, bankId: string, subject: PhotoSubject, subjectId: string) =>
  db
    .deleteFrom('photos')
    .where('bank_id', '=', bankId)
    .where('subject', '=', subject)
    .where('subject_id', '=', subjectId)
    .returning(['full_key', 'thumb_key'])
    .execute();

/** The photos of these subjects, of any bank: the caller has scoped the ids. */
export const photosOfSubjects = (db: DbOrTx, subject: PhotoSubject, subjectIds: string[]) =>
  db
    .selectFrom('photos')
    .select(['id', 'subject_id', 'width', 'height', 'created_at'])
    .where('subject', '=', subject)
    .where('subject_id', 'in', subjectIds)
    .orderBy('created_at')
    .execute();

export const listSubjectPhotos = (db: DbOrTx, bankId: string, subject: PhotoSubject, subjectId: string) =>
  db
    .selectFrom('photos')
    .select(['id', 'width', 'height', 'created_at'])
    .where('bank_id', '=', bankId)
    .where('subject', '=', subject)
    .where('subject_id', '=', subjectId)
    .orderBy('created_at')
    .execute();

/**
 * The subject's id when it is in the bank: a tray through its test (and, when `testId` is given,
 * only as a tray of that test), a lot or plant directly.
 */
export const findSubjectInBank = (
  db: DbOrTx,
  bankId: string,
  subject: PhotoSubject,
  subjectId: string,
  testId?: string,
) =>
  subject === 'tray'
    ? db
        .selectFrom('test_trays')
        .innerJoin('germination_tests', 'germination_tests.id', 'test_trays.test_id')
        .select('test_trays.id')
        .where('test_trays.id', '=', subjectId)
        .where('germination_tests.bank_id', '=', bankId)
        .$if(testId !== undefined, (q) => q.where('test_trays.test_id', '=', testId!))
        .executeTakeFirst()
    : db
        .selectFrom(SUBJECT_TABLE[subject])
        .select('id')
        .where('id', '=', subjectId)
        .where('bank_id', '=', bankId)
        .executeTakeFirst();

export const insertPhoto = (db: DbOrTx, values: Insertable<PhotoTable>) =>
  db
    .insertInto('photos')
    .values(values)
    .returning(['id', 'width', 'height', 'created_at'])
    .executeTakeFirstOrThrow();

/** Deletes one photo of the bank, returning its object keys. */
export const deletePhoto = (db: DbOrTx, bankId: string, photoId: string) =>
  db
    .deleteFrom('photos')
    .where('id', '=', photoId)
    .where('bank_id', '=', bankId)
    .returning(['full_key', 'thumb_key'])
    .executeTakeFirst();

/** The photo's object keys, when `userId` is a member of its bank. */
export const findPhotoForMember = (db: DbOrTx, photoId: string, userId: string) =>
  db
    .selectFrom('photos')
    .innerJoin('memberships', (join) =>
      join.onRef('memberships.bank_id', '=', 'photos.bank_id').on('memberships.user_id', '=', userId),
    )
    .select(['photos.full_key', 'photos.thumb_key'])
    .where('photos.id', '=', photoId)
    .executeTakeFirst();
