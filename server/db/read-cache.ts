import type { RequestHandler } from 'express';
import type { ChangeFeed } from './change-feed';

/**
 * What a server keeps of its database reads between requests, and forgets as soon as they may be
 * out of date:
 *  - at once, when this server handles any write (see forgetOnWrites: before its answer leaves);
 *  - when PostgreSQL's change notice arrives, for writes by another server, a background job or a
 *    hand-written statement (ChangeFeed; milliseconds after their commit);
 *  - everything, whenever the feed loses its connection, and nothing is kept until it is back.
 * A read that was under way while something changed is not kept (the generation moved on).
 *
 * Scopes: `auth` (sessions and memberships) and one per bank, for views computed only from that
 * bank's records and the reference species (see the migration's list of tables with notices).
 */
export interface ReadCache {
  get<T>(scope: CacheScope, key: string): T | undefined;
  /** A ticket for a read starting now, or null when nothing may be kept. */
  ticket(): number | null;
  /** Keeps `value` unless anything was forgotten since `ticket` was taken. */
  put(scope: CacheScope, key: string, value: unknown, ticket: number | null): void;
  /** The kept value, or `load()`'s, kept for next time. */
  remember<T>(scope: CacheScope, key: string, load: () => Promise<T>): Promise<T>;
  /** Forgets everything (this server has just written). */
  forgetAll(): void;
}

export type CacheScope = 'auth' | { bankId: string };

/** How many entries each kind of scope holds before the oldest goes. */
const LIMITS = { auth: 20_000, banks: 500 } as const;

export function createReadCache(feed: ChangeFeed | undefined): ReadCache {
  const auth = new Map<string, unknown>();
  const banks = new Map<string, Map<string, unknown>>();
  let bankEntries = 0;
  let generation = 0;

  function forgetBank(bankId: string) {
    generation += 1;
    if (bankId === '*') {
      banks.clear();
      bankEntries = 0;
      return;
    }
    bankEntries -= banks.get(bankId)?.size ?? 0;
    banks.delete(bankId);
  }

  function forgetAll() {
    generation += 1;
    auth.clear();
    banks.clear();
    bankEntries = 0;
  }

  feed?.subscribe((notice) => {
    if (notice.kind === 'bank') forgetBank(notice.bankId);
    else if (notice.kind === 'auth') {
      generation += 1;
      auth.clear();
    } else forgetAll();
  });

  const mapOf = (scope: CacheScope, create: boolean) => {
    if (scope === 'auth') return auth;
    let map = banks.get(scope.bankId);
    if (!map && create) banks.set(scope.bankId, (map = new Map()));
    return map;
  };

  function put(scope: CacheScope, key: string, value: unknown, ticket: number | null) {
    if (ticket === null || ticket !== generation || !feed?.live) return;
    if (scope === 'auth') {
      if (auth.size >= LIMITS.auth && !auth.has(key)) auth.delete(auth.keys().next().value!);
      auth.set(key, value);
      return;
    }
    // Past the limit the banks' pages start afresh; sessions and roles stay.
    if (bankEntries >= LIMITS.banks && !mapOf(scope, false)?.has(key)) {
      banks.clear();
      bankEntries = 0;
    }
    const map = mapOf(scope, true)!;
    if (!map.has(key)) bankEntries += 1;
    map.set(key, value);
  }

  const ticket = () => (feed?.live ? generation : null);

  const get = <T>(scope: CacheScope, key: string) =>
    (feed?.live ? mapOf(scope, false)?.get(key) : undefined) as T | undefined;

  return {
    get,
    ticket,
    put,
    async remember<T>(scope: CacheScope, key: string, load: () => Promise<T>): Promise<T> {
      const kept = get<T>(scope, key);
      if (kept !== undefined) return kept;
      const started = ticket();
      const value = await load();
      put(scope, key, value, started);
      return value;
    },
    forgetAll,
  };
}

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Forgets everything kept when this server answers a write, before the answer's first byte: a
 * grower who saved something and reloads sees it, whichever screen reads it. (Other servers learn
 * of the write from its change notice.)
 */
export function forgetOnWrites(cache: ReadCache): RequestHandler {
  return (req, res, next) => {
    if (READS.has(req.method)) return next();
    const writeHead = res.writeHead;
    res.writeHead = function (this: typeof res, ...args: Parameters<typeof writeHead>) {
      cache.forgetAll();
      return writeHead.apply(this, args);
    } as typeof writeHead;
    // Also when the answer never started (a dropped connection) or after a late write.
    res.once('close', () => cache.forgetAll());
    next();
  };
}
