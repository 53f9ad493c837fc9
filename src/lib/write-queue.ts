import { useEffect, useSyncExternalStore } from 'react';
import { apiFetch, isApiError } from './api-client';

/*
 * Writes made at the bench without a signal — counts, what came up — kept on this device in
 * IndexedDB until the server has them: shown as waiting to send, never lost (a reload or a closed
 * tab keeps them), never applied twice (each carries an Idempotency-Key the server keeps its first
 * answer under, server/http/idempotency.ts), and sent in the order they were made. A write the
 * server refuses when it finally arrives stays, with the server's reason, until the grower
 * dismisses it. Writes belong to the member who made them and go only with that member's session;
 * signing out deletes them (clearWrites).
 */

export interface QueuedWrite {
  /** Also the Idempotency-Key it is sent with. */
  id: string;
  /** The member who made it; only their session sends it. */
  userId: string;
  bankId: string;
  /** What it is about, for the page that shows it (`test:<id>`, `plan-entry:<id>`). */
  subject: string;
  /** What it is, in the grower's words. */
  label: string;
  /** The POST it is: an API path and its JSON body. */
  path: string;
  body: unknown;
  /** When it was made (ISO); writes go in this order. */
  queuedAt: string;
  /** Set when the server refused it: its reason, shown until the grower dismisses the write. */
  refused?: { status: number; code: string; message: string } | undefined;
}

export type NewWrite = Pick<QueuedWrite, 'bankId' | 'subject' | 'label' | 'path' | 'body'>;

/** How long one send may take before the write is left for the next try (a bench with weak Wi-Fi). */
const SEND_TIMEOUT_MS = 20_000;
const DB_NAME = 'hilum-offline';
const STORE = 'writes';
const CHANNEL = 'hilum-write-queue';
const LOCK = 'hilum-write-queue';

// ---- IndexedDB ------------------------------------------------------------------------------

let opening: Promise<IDBDatabase> | null = null;
function database(): Promise<IDBDatabase> {
  opening ??= new Promise((resolve, reject) => {
    const request = indexedDB.open(DB_NAME, 1);
    request.onupgradeneeded = () => request.result.createObjectStore(STORE, { keyPath: 'id' });
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error ?? new Error('IndexedDB would not open'));
  });
  return opening;
}

/** Runs one request in a transaction and resolves once the transaction is durable. */
async function inStore<T>(
  mode: IDBTransactionMode,
  run: (store: IDBObjectStore) => IDBRequest<T>,
): Promise<T> {
  const db = await database();
  return new Promise((resolve, reject) => {
    const tx = db.transaction(STORE, mode);
    const request = run(tx.objectStore(STORE));
    tx.oncomplete = () => resolve(request.result);
    tx.onerror = () => reject(tx.error ?? new Error('IndexedDB transaction failed'));
    tx.onabort = () => reject(tx.error ?? new Error('IndexedDB transaction aborted'));
  });
}

// ---- What the pages see ---------------------------------------------------------------------

let owner: string | null = null;
/** Whether the signed-in member's writes have been read from the device since they signed in. */
let ready = false;
let all: QueuedWrite[] = [];
let mine: QueuedWrite[] = [];
const listeners = new Set<() => void>();
const channel = typeof BroadcastChannel === 'undefined' ? null : new BroadcastChannel(CHANNEL);
channel?.addEventListener('message', () => void reload(false));

function publish() {
  mine = owner === null ? [] : all.filter((w) => w.userId === owner);
  ready = owner !== null;
  for (const listener of listeners) listener();
}

/** Reads the queue again from IndexedDB (and tells the other tabs, when this tab changed it). */
async function reload(broadcast = true): Promise<void> {
  try {
    const rows = await inStore('readonly', (store) => store.getAll() as IDBRequest<QueuedWrite[]>);
    all = rows.sort((a, b) => a.queuedAt.localeCompare(b.queuedAt));
  } catch {
    all = []; // no IndexedDB (a private window in some browsers): nothing can be kept
  }
  publish();
  if (broadcast) channel?.postMessage('changed');
}

/** The signed-in member (null when signed out): the queue shows and sends only their writes. */
export function setQueueOwner(userId: string | null): void {
  if (owner === userId) return;
  owner = userId;
  ready = false;
  void reload(false);
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The signed-in member's queued writes, oldest first, following every change (in any tab). */
export function useQueuedWrites(): QueuedWrite[] {
  return useSyncExternalStore(
    subscribe,
    () => mine,
    () => mine,
  );
}

/**
 * Whether the signed-in member's queued writes have been read from the device yet (a page that
 * starts its form from them waits for, or starts again on, this).
 */
export function useQueueReady(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => ready,
    () => false,
  );
}

/** Whether the browser thinks it has a network, following changes. */
export function useOnline(): boolean {
  return useSyncExternalStore(
    (onChange) => {
      window.addEventListener('online', onChange);
      window.addEventListener('offline', onChange);
      return () => {
        window.removeEventListener('online', onChange);
        window.removeEventListener('offline', onChange);
      };
    },
    () => navigator.onLine,
    () => true,
  );
}

// ---- Sending --------------------------------------------------------------------------------

/** An answer that may change if the write is sent again later: no network, a server down, busy or restarting, a session to renew. */
function worthRetrying(error: unknown): boolean {
  if (!isApiError(error)) return true; // the send timed out
  const { status, code } = error;
  return (
    status === 0 ||
    status >= 500 ||
    status === 401 ||
    status === 408 ||
    status === 429 ||
    (status === 409 && code === 'request_in_progress')
  );
}

function send(write: QueuedWrite): Promise<unknown> {
  return apiFetch(write.path, {
    method: 'POST',
    body: write.body,
    headers: { 'Idempotency-Key': write.id },
    signal: AbortSignal.timeout(SEND_TIMEOUT_MS),
  });
}

/** One sender at a time across this device's tabs (a repeat would be harmless, but wasted). */
function exclusively<T>(run: () => Promise<T>): Promise<T> {
  if (typeof navigator !== 'undefined' && navigator.locks) return navigator.locks.request(LOCK, run);
  return run();
}

/**
 * Keeps a write on this device, then sends it at once when the network allows and no older write
 * is waiting before it. Resolves with the server's answer when it was sent, or `queued` when it
 * waits to be sent later (flushWrites). A refusal that sending again would not change (a 4xx)
 * rejects with the ApiError, and the write is not kept: the page shows why beside what was typed.
 */
export async function submitWrite(
  write: NewWrite,
): Promise<{ sent: true; answer: unknown } | { sent: false; queued: QueuedWrite }> {
  if (owner === null) throw new Error('Nobody is signed in to send this.');
  const queued: QueuedWrite = {
    ...write,
    id: crypto.randomUUID(),
    userId: owner,
    queuedAt: new Date().toISOString(),
  };
  await inStore('readwrite', (store) => store.put(queued));
  const earlier = mine.some((w) => w.refused === undefined);
  await reload();
  if (!navigator.onLine || earlier) {
    void flushWrites();
    return { sent: false, queued };
  }
  return exclusively(async () => {
    try {
      const answer = await send(queued);
      await removeWrite(queued.id);
      return { sent: true, answer };
    } catch (error) {
      if (worthRetrying(error)) return { sent: false, queued };
      await removeWrite(queued.id);
      throw error;
    }
  });
}

type SentListener = (write: QueuedWrite, answer: unknown) => void;
const sentListeners = new Set<SentListener>();

/** Hears of each write the queue sent later, to refresh what it changed. */
export function onQueuedWriteSent(listener: SentListener): () => void {
  sentListeners.add(listener);
  return () => sentListeners.delete(listener);
}

let flushing: Promise<void> | null = null;

/**
 * Sends the signed-in member's waiting writes in order, stopping at the first one the network or
 * the server cannot take now (it and those after it wait for the next try); a refused write is
 * marked with the reason and the rest go on.
 */
export function flushWrites(): Promise<void> {
  flushing ??= exclusively(async () => {
    await reload(false);
    for (const write of mine.filter((w) => w.refused === undefined)) {
      if (!navigator.onLine) break;
      try {
        const answer = await send(write);
        await removeWrite(write.id);
        for (const listener of sentListeners) listener(write, answer);
      } catch (error) {
        if (worthRetrying(error)) break;
        const refused = isApiError(error)
          ? { status: error.status, code: error.code, message: error.message }
          : { status: 0, code: 'refused', message: 'The server did not accept this.' };
        await inStore('readwrite', (store) => store.put({ ...write, refused }));
        await reload();
      }
    }
  }).finally(() => {
    flushing = null;
  });
  return flushing;
}

export async function removeWrite(id: string): Promise<void> {
  await inStore('readwrite', (store) => store.delete(id));
  await reload();
}

/** Deletes every queued write on this device (signing out: nothing of one member stays for the next). */
export async function clearWrites(): Promise<void> {
  try {
    await inStore('readwrite', (store) => store.clear());
  } catch {
    // no IndexedDB: nothing was kept
  }
  await reload();
}

/** How often waiting writes are tried again while the browser says it is online. */
const RETRY_EVERY_MS = 15_000;

/**
 * Sends the signed-in member's waiting writes: at sign-in and page load, when the network comes
 * back, and every little while as long as some wait (a weak signal can drop requests while the
 * browser still says it is online). `onSent` hears of each one sent.
 */
export function useWriteQueueSender(userId: string | undefined, onSent: SentListener): void {
  useEffect(() => {
    setQueueOwner(userId ?? null);
    if (!userId) return;
    void flushWrites();
    const flush = () => void flushWrites();
    window.addEventListener('online', flush);
    const timer = window.setInterval(() => {
      if (navigator.onLine && mine.some((w) => w.refused === undefined)) flush();
    }, RETRY_EVERY_MS);
    return () => {
      window.removeEventListener('online', flush);
      window.clearInterval(timer);
    };
  }, [userId]);
  useEffect(() => onQueuedWriteSent(onSent), [onSent]);
}
