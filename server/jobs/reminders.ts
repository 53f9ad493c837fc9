import { CompiledQuery } from 'kysely';
import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { DbOrTx } from '../db/database';

export const REMINDER_QUEUE = 'send-reminder';

/** What the queue runs: the reminders module's service, handed in by whoever wires the app. */
export interface ReminderWork {
  /** Writes the reminder rows due now; `enqueue` runs in each new row's transaction. */
  queueDue(enqueue: (trx: DbOrTx, reminderId: string) => Promise<void>): Promise<number>;
  /** Sends one reminder at most once. */
  deliver(reminderId: string): Promise<void>;
}

export interface ReminderQueueOptions {
  databaseUrl: string;
  logger?: Logger;
  /** Seconds before a failed send is retried (doubling each time). */
  retryDelaySeconds?: number;
  pollingIntervalSeconds?: number;
}

/**
 * E-mail reminders on a durable queue. A scan (`tick`) has the reminders service turn what is due
 * on each bank's calendar into reminder rows, and queues one pg-boss job per new row in the same
 * transaction. Workers hand each job to the service, which sends the row once; a failed send is
 * retried with backoff. Rows and jobs live in PostgreSQL, so a restart loses nothing; a reminder
 * missed while the server was down is still found by the next scan.
 */
export function createReminderQueue(work: ReminderWork, options: ReminderQueueOptions) {
  const createBoss = () => {
    const created = new PgBoss({
      connectionString: options.databaseUrl,
      schema: 'pgboss',
      max: 3,
      schedule: false,
      supervise: true,
    });
    // Its pool's errors and failed polls while the database restarts: logged, and pg-boss polls again.
    created.on('error', (error) => options.logger?.warn({ err: error }, 'job queue error'));
    return created;
  };
  let boss = createBoss();
  let started = false;

  /** pg-boss inserts its job through our transaction, so the row and its job commit together. */
  const inTransaction = (trx: DbOrTx) => ({
    executeSql: async (text: string, values: unknown[]) => {
      const result = await trx.executeQuery(CompiledQuery.raw(text, values));
      return { rows: result.rows as unknown[] };
    },
  });

  return {
    /** Finds what is due now and queues it; returns how many reminders were newly queued. */
    tick: () =>
      work.queueDue(async (trx, reminderId) => {
        await boss.send(
          REMINDER_QUEUE,
          { reminderId },
          {
            singletonKey: reminderId,
            retryLimit: 8,
            retryDelay: options.retryDelaySeconds ?? 60,
            retryBackoff: true,
            db: inTransaction(trx),
          },
        );
      }),
    deliver: (reminderId: string) => work.deliver(reminderId),
    async start() {
      try {
        await boss.start();
      } catch (error) {
        // A pg-boss whose start failed half way cannot be started again: close its pool and keep a
        // fresh one for the next try (the server retries while the database is down at boot).
        const failed = boss.getDb() as PgBoss.Db & { opened?: boolean; close?: () => Promise<void> };
        if (failed.opened) await failed.close?.().catch(() => undefined);
        boss = createBoss();
        throw error;
      }
      started = true;
      await boss.createQueue(REMINDER_QUEUE);
      await boss.work<{ reminderId: string }>(
        REMINDER_QUEUE,
        { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2, batchSize: 5 },
        async (jobs) => {
          for (const job of jobs) await work.deliver(job.data.reminderId);
        },
      );
    },
    async stop() {
      if (started) await boss.stop({ graceful: true, wait: true, timeout: 5_000 });
      started = false;
    },
  };
}

export type Reminders = ReturnType<typeof createReminderQueue>;
