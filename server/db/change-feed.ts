import crypto from 'node:crypto';
import pg from 'pg';
import type { Logger } from 'pino';

/**
 * What PostgreSQL says changed (migration 2026_12_02_000300_change_notices): a bank's records
 * (`'*'`: reference data every bank reads), or sessions and memberships. `reset` means notices may
 * have been missed (the feed's connection was lost or has just come back): forget everything.
 */
export type ChangeNotice = { kind: 'bank'; bankId: string } | { kind: 'auth' } | { kind: 'reset' };

export interface ChangeFeed {
  /** True while notices are being received; only then may anything be kept between requests. */
  readonly live: boolean;
  subscribe(listener: (notice: ChangeNotice) => void): () => void;
  /**
   * Resolves once every notice of a transaction committed before the call has been delivered:
   * PostgreSQL hands a listener its notices in commit order, and this one is sent after them.
   */
  sync(): Promise<void>;
  /** Resolves once the feed is listening (start-up, tests). */
  ready(): Promise<void>;
  close(): Promise<void>;
}

const CHANNEL = 'hilum_changes';
/** How the feed's connection is named in pg_stat_activity. */
export const CHANGE_FEED_APPLICATION = 'hilum change feed';
const RETRY_MS = { first: 250, most: 5_000 };

/**
 * One dedicated connection that listens for change notices, for as long as the feed is open. A
 * lost connection (a database restart, a network fault) is never fatal: the feed says `reset`,
 * is not live until it has listened again, and retries with backoff.
 */
export function startChangeFeed(databaseUrl: string, logger?: Logger): ChangeFeed {
  const listeners = new Set<(notice: ChangeNotice) => void>();
  const fences = new Map<string, () => void>();
  let client: pg.Client | null = null;
  let live = false;
  let closed = false;
  let retryMs = RETRY_MS.first;
  let retry: NodeJS.Timeout | undefined;

  const tell = (notice: ChangeNotice) => {
    for (const listener of listeners) listener(notice);
  };

  function received(payload: string) {
    if (payload === 'auth') return tell({ kind: 'auth' });
    if (payload.startsWith('bank ')) return tell({ kind: 'bank', bankId: payload.slice(5) });
    if (payload.startsWith('sync ')) {
      const id = payload.slice(5);
      fences.get(id)?.();
      fences.delete(id);
    }
  }

  function lost(current: pg.Client, error?: Error) {
    if (client !== current) return;
    client = null;
    const wasLive = live;
    live = false;
    tell({ kind: 'reset' });
    current.removeAllListeners('notification');
    current.end().catch(() => undefined);
    if (closed) return;
    if (wasLive)
      logger?.warn(
        { err: error },
        'change notices lost; nothing is kept between requests until they are back',
      );
    retry = setTimeout(connect, retryMs);
    retryMs = Math.min(RETRY_MS.most, retryMs * 2);
  }

  async function connect() {
    retry = undefined;
    if (closed) return;
    const current = new pg.Client({
      connectionString: databaseUrl,
      application_name: CHANGE_FEED_APPLICATION,
    });
    client = current;
    current.on('error', (error) => lost(current, error));
    current.on('end', () => lost(current));
    current.on('notification', (message) => {
      if (message.channel === CHANNEL) received(message.payload ?? '');
    });
    try {
      await current.connect();
      await current.query(`listen ${CHANNEL}`);
      if (client !== current || closed) return;
      live = true;
      retryMs = RETRY_MS.first;
      // Whatever was kept before this point may have missed notices.
      tell({ kind: 'reset' });
    } catch (error) {
      lost(current, error as Error);
    }
  }

  void connect();

  return {
    get live() {
      return live;
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    ready() {
      if (live) return Promise.resolve();
      return new Promise<void>((resolve) => {
        const stop = this.subscribe(() => {
          if (!live) return;
          stop();
          resolve();
        });
      });
    },
    async sync() {
      const current = client;
      if (!current || !live) throw new Error('the change feed is not connected');
      const id = crypto.randomUUID();
      const arrived = new Promise<void>((resolve) => fences.set(id, resolve));
      await current.query('select pg_notify($1, $2)', [CHANNEL, `sync ${id}`]);
      await arrived;
    },
    async close() {
      closed = true;
      if (retry) clearTimeout(retry);
      const current = client;
      client = null;
      live = false;
      tell({ kind: 'reset' });
      if (current) await current.end().catch(() => undefined);
    },
  };
}
