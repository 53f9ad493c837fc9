import { sql } from 'kysely';
import type { DbOrTx } from './database';

/** What a request with an Idempotency-Key found: its own fresh claim, or the key's earlier row. */
export type KeyClaim =
  | { kind: 'claimed' }
  | { kind: 'running'; requestHash: string }
  | { kind: 'done'; requestHash: string; status: number; body: unknown };

/**
 * Claims a member's key for one request in one statement, so two servers receiving the same write
 * at once never both run it: a new key is inserted, a claim older than `staleBefore` whose server
 * never answered (it died mid-request) is taken over by the same request, and anything else is
 * read back as it stands. A member's rows older than `sweepBefore` are forgotten on the way.
 */
export async function claimIdempotencyKey(
  db: DbOrTx,
  claim: {
    userId: string;
    key: string;
    requestHash: string;
    now: Date;
    staleBefore: Date;
    sweepBefore: Date;
  },
): Promise<KeyClaim> {
  await db
    .deleteFrom('idempotency_keys')
    .where('user_id', '=', claim.userId)
    .where('created_at', '<', claim.sweepBefore)
    .execute();
  const took = await db
    .insertInto('idempotency_keys')
    .values({
      user_id: claim.userId,
      key: claim.key,
      request_hash: claim.requestHash,
      status: null,
      body: null,
      created_at: claim.now,
    })
    .onConflict((oc) =>
      oc
        .columns(['user_id', 'key'])
        .doUpdateSet({ created_at: claim.now })
        .where('idempotency_keys.status', 'is', null)
        .where('idempotency_keys.created_at', '<', claim.staleBefore)
        .where('idempotency_keys.request_hash', '=', claim.requestHash),
    )
    .returning(sql<number>`1`.as('claimed'))
    .executeTakeFirst();
  if (took) return { kind: 'claimed' };
  const row = await db
    .selectFrom('idempotency_keys')
    .select(['request_hash', 'status', 'body'])
    .where('user_id', '=', claim.userId)
    .where('key', '=', claim.key)
    .executeTakeFirst();
  // Released between the two statements (its request failed): the client may send it again.
  if (!row) return { kind: 'running', requestHash: claim.requestHash };
  if (row.status === null) return { kind: 'running', requestHash: row.request_hash };
  return { kind: 'done', requestHash: row.request_hash, status: row.status, body: row.body };
}

/** Keeps the first answer of a claimed key (`body` as JSON text, or null for an empty answer). */
export async function recordIdempotentAnswer(
  db: DbOrTx,
  at: { userId: string; key: string },
  status: number,
  body: string | null,
): Promise<void> {
  await db
    .updateTable('idempotency_keys')
    .set({ status, body })
    .where('user_id', '=', at.userId)
    .where('key', '=', at.key)
    .where('status', 'is', null)
    .execute();
}

/** Gives a claim back when its request failed on the server's side, so the write can be sent again. */
export async function releaseIdempotencyKey(db: DbOrTx, at: { userId: string; key: string }): Promise<void> {
  await db
    .deleteFrom('idempotency_keys')
    .where('user_id', '=', at.userId)
    .where('key', '=', at.key)
    .where('status', 'is', null)
    .execute();
}
