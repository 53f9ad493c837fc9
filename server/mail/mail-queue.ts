import { sql } from 'kysely';
import type { Logger } from 'pino';
import type { Clock } from '../clock';
import type { Db, DbOrTx } from '../db/database';
import type { MailKind } from '../db/schema';
import type { Mailer } from './mailer';

export interface QueuedMail {
  kind: MailKind;
  to: string;
  /** Omitted when the text is written at sending time by the kind's preparer (see `prepareWith`). */
  subject?: string;
  text?: string;
  /** Not sent after this moment (app clock): a link that has expired is not worth a mail. */
  expiresAt?: Date;
}

/**
 * Writes a mail's subject and text when it is about to be sent, in a transaction of its own;
 * null means there is nothing to send (a reset asked for an address that has no account).
 */
export type MailPreparer = (trx: DbOrTx, to: string) => Promise<{ subject: string; text: string } | null>;

export interface MailQueueOptions {
  db: Db;
  mailer: Mailer;
  clock: Clock;
  logger?: Logger;
  /** First retry after this long; each further one waits twice as long, up to `maxRetryDelayMs`. */
  retryDelayMs?: number;
  maxRetryDelayMs?: number;
  /** A send claimed longer ago than this is taken to have died with its process, and is retried. */
  leaseMs?: number;
}

/** Delay before retry number `attempts` (1 = after the first failure): doubling, capped. */
export function retryDelay(attempts: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, attempts - 1));
}

/**
 * The durable mail queue. A mail is a `mail_queue` row, inserted by `enqueue` in the transaction of
 * what it announces, so both commit or neither does; the request answers without touching SMTP.
 * A worker claims due rows (`for update skip locked`, so several servers share the queue), sends,
 * and marks each sent; a failed send goes back to waiting with a doubling delay.
 *
 * What is guaranteed: a committed mail is sent (retried until it is, or until its link expires),
 * and a row is claimed by one worker at a time, so it is sent once. The one exception: if the
 * process dies after the SMTP server took the message and before the row is marked sent (one
 * UPDATE), the claim runs out after `leaseMs` and the mail is sent a second time — at least once,
 * never lost. `kick` starts sending at once in this process; `start` also polls, for retries, for
 * rows another server wrote, and for rows left by a crash.
 */
export function createMailQueue(options: MailQueueOptions) {
  const { db, mailer, clock, logger } = options;
  const baseDelay = options.retryDelayMs ?? 30_000;
  const maxDelay = options.maxRetryDelayMs ?? 60 * 60 * 1000;
  const leaseSeconds = (options.leaseMs ?? 2 * 60 * 1000) / 1000;
  const preparers = new Map<MailKind, MailPreparer>();
  let running: Promise<void> | null = null;
  let again = false;
  let stopped = false;
  let poll: NodeJS.Timeout | undefined;

  /** Takes the next due row for this worker, or undefined when none is due. */
  const claim = () =>
    sql<{
      id: string;
      kind: MailKind;
      to_address: string;
      subject: string | null;
      body: string | null;
      attempts: number;
      expires_at: Date | null;
    }>`
      update mail_queue set status = 'sending', claimed_at = now(), attempts = attempts + 1
      where id = (
        select id from mail_queue
        where (status = 'waiting' and next_attempt_at <= now())
           or (status = 'sending' and claimed_at < now() - make_interval(secs => ${leaseSeconds}))
        order by next_attempt_at
        limit 1
        for update skip locked)
      returning id, kind, to_address, subject, body, attempts, expires_at`
      .execute(db)
      .then((r) => r.rows[0]);

  const finish = (id: string, status: 'sent' | 'skipped' | 'expired') =>
    db
      .updateTable('mail_queue')
      .set({
        status,
        claimed_at: null,
        body: null,
        last_error: null,
        sent_at: status === 'sent' ? new Date() : null,
      })
      .where('id', '=', id)
      .where('status', '=', 'sending')
      .execute();

  async function deliver(row: NonNullable<Awaited<ReturnType<typeof claim>>>) {
    if (row.expires_at && row.expires_at <= clock.now()) return finish(row.id, 'expired');
    let { subject, body } = row;
    if (subject == null || body == null) {
      const prepare = preparers.get(row.kind);
      if (!prepare) throw new Error(`no text for a ${row.kind} mail`);
      const written = await db.transaction().execute(async (trx) => {
        const mail = await prepare(trx, row.to_address);
        if (mail) {
          await trx
            .updateTable('mail_queue')
            .set({ subject: mail.subject, body: mail.text })
            .where('id', '=', row.id)
            .execute();
        }
        return mail;
      });
      if (!written) return finish(row.id, 'skipped');
      ({ subject, text: body } = written);
    }
    try {
      await mailer.send({ to: row.to_address, subject, text: body });
    } catch (error) {
      const delayMs = retryDelay(row.attempts, baseDelay, maxDelay);
      logger?.warn(
        { err: error, mailId: row.id, attempts: row.attempts, delayMs },
        'mail not sent; will retry',
      );
      await db
        .updateTable('mail_queue')
        .set({
          status: 'waiting',
          claimed_at: null,
          last_error: error instanceof Error ? error.message.slice(0, 500) : String(error),
          next_attempt_at: sql<Date>`now() + make_interval(secs => ${delayMs / 1000})`,
        })
        .where('id', '=', row.id)
        .execute();
      return;
    }
    await finish(row.id, 'sent');
  }

  async function sendDue() {
    for (;;) {
      const row = await claim();
      if (!row) return;
      await deliver(row);
    }
  }

  function kick() {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    running = (async () => {
      do {
        again = false;
        try {
          await sendDue();
        } catch (error) {
          // The database is away: the rows stay, and the next kick or poll sends them.
          logger?.warn({ err: error }, 'mail queue paused');
        }
      } while (again && !stopped);
    })().finally(() => {
      running = null;
    });
  }

  return {
    /** Queues a mail in the caller's transaction; call `kick` after it commits. */
    async enqueue(trx: DbOrTx, mail: QueuedMail): Promise<string> {
      const row = await trx
        .insertInto('mail_queue')
        .values({
          kind: mail.kind,
          to_address: mail.to,
          subject: mail.subject ?? null,
          body: mail.text ?? null,
          expires_at: mail.expiresAt ?? null,
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      return row.id;
    },
    /** Stops a mail that has not been taken for sending yet (replaced by a newer one). */
    async cancel(trx: DbOrTx, mailId: string) {
      await trx
        .updateTable('mail_queue')
        .set({ status: 'skipped', body: null })
        .where('id', '=', mailId)
        .where('status', '=', 'waiting')
        .execute();
    },
    prepareWith(kind: MailKind, prepare: MailPreparer) {
      preparers.set(kind, prepare);
    },
    /** Starts sending what is due now, in the background of this process. */
    kick,
    /** Sends everything due now and resolves when done (the demo and tests). */
    async drain() {
      kick();
      while (running) await running;
    },
    /** Also polls every `pollMs`: retries, other servers' rows, rows a crash left claimed. */
    start({ pollMs = 2_000 }: { pollMs?: number } = {}) {
      stopped = false;
      kick();
      poll ??= setInterval(kick, pollMs);
    },
    async stop() {
      stopped = true;
      if (poll) clearInterval(poll);
      poll = undefined;
      while (running) await running;
    },
  };
}

export type MailQueue = ReturnType<typeof createMailQueue>;
