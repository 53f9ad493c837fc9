import { describe, expect, it } from 'vitest';
import type { ChangeFeed, ChangeNotice } from '#server/db/change-feed';
import { createReadCache } from '#server/db/read-cache';

// The rules of what a server keeps between requests, without a database: notices are handed in by
// hand here (tests/api/read-cache.test.ts has the real feed, servers and statements).
function handFeed() {
  const listeners = new Set<(notice: ChangeNotice) => void>();
  const feed: ChangeFeed & { live: boolean } = {
    live: true,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    sync: async () => undefined,
    ready: async () => undefined,
    close: async () => undefined,
  };
  return { feed, tell: (notice: ChangeNotice) => listeners.forEach((listener) => listener(notice)) };
}

const A = { bankId: 'a' };
const B = { bankId: 'b' };

describe('the read cache', () => {
  it('when something changes while a read is under way, then what it read is not kept', async () => {
    const { feed, tell } = handFeed();
    const cache = createReadCache(feed);
    const ticket = cache.ticket();
    tell({ kind: 'bank', bankId: 'a' });
    cache.put(A, 'page', 'read before the change', ticket);
    expect(cache.get(A, 'page')).toBeUndefined();

    let release: (value: string) => void = () => undefined;
    const reading = cache.remember(A, 'page', () => new Promise<string>((resolve) => (release = resolve)));
    cache.forgetAll();
    release('read across a write');
    expect(await reading).toBe('read across a write');
    expect(cache.get(A, 'page')).toBeUndefined();
  });

  it('when a notice names one bank, then only that bank is forgotten; `*` forgets every bank', () => {
    const { feed, tell } = handFeed();
    const cache = createReadCache(feed);
    const keep = () => {
      cache.put(A, 'page', 1, cache.ticket());
      cache.put(B, 'page', 2, cache.ticket());
      cache.put('auth', 'session s', 3, cache.ticket());
    };
    keep();
    tell({ kind: 'bank', bankId: 'a' });
    expect([cache.get(A, 'page'), cache.get(B, 'page'), cache.get('auth', 'session s')]).toEqual([
      undefined,
      2,
      3,
    ]);
    keep();
    tell({ kind: 'bank', bankId: '*' });
    expect([cache.get(A, 'page'), cache.get(B, 'page'), cache.get('auth', 'session s')]).toEqual([
      undefined,
      undefined,
      3,
    ]);
    keep();
    tell({ kind: 'auth' });
    expect([cache.get(A, 'page'), cache.get(B, 'page'), cache.get('auth', 'session s')]).toEqual([
      1,
      2,
      undefined,
    ]);
    keep();
    tell({ kind: 'reset' });
    expect([cache.get(A, 'page'), cache.get(B, 'page'), cache.get('auth', 'session s')]).toEqual([
      undefined,
      undefined,
      undefined,
    ]);
  });

  it('when the feed is not live, or there is none, then nothing is kept and every read loads', async () => {
    const { feed } = handFeed();
    const cache = createReadCache(feed);
    feed.live = false;
    expect(cache.ticket()).toBeNull();
    let loads = 0;
    const load = async () => (loads += 1);
    await cache.remember(A, 'page', load);
    await cache.remember(A, 'page', load);
    expect(loads).toBe(2);

    const none = createReadCache(undefined);
    await none.remember(A, 'page', load);
    await none.remember(A, 'page', load);
    expect(loads).toBe(4);
  });

  it('when more pages are kept than the limit allows, then the banks start afresh and the newest page and the sessions stay', () => {
    const { feed } = handFeed();
    const cache = createReadCache(feed);
    cache.put('auth', 'session s', 'kept', cache.ticket());
    for (let i = 0; i < 500; i++) cache.put({ bankId: `bank ${i}` }, 'page', i, cache.ticket());
    expect(cache.get({ bankId: 'bank 0' }, 'page')).toBe(0);
    cache.put({ bankId: 'one more' }, 'page', 'newest', cache.ticket());
    expect(cache.get({ bankId: 'one more' }, 'page')).toBe('newest');
    expect(cache.get({ bankId: 'bank 0' }, 'page')).toBeUndefined();
    expect(cache.get('auth', 'session s')).toBe('kept');
  });
});
