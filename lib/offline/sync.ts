/**
 * The sync engine (lib/offline/engine.ts) wired to the browser: the IndexedDB outbox, fetch, Web
 * Locks, real timers, and the page's online, visibility and service-worker events.
 */
import { SYNC_BATCH_LIMIT } from '@/lib/contracts/sync';
import { LOCAL, SYNC_TAG } from '@/lib/device-keys';
import { browserOutbox, fetchTransport, realClock, webLock } from '@/lib/offline/browser';
import { createSyncEngine, type SyncEngine } from '@/lib/offline/engine';

export type { SyncStatus } from '@/lib/offline/engine';

/**
 * Record collections, drained in this order before photos. Each endpoint takes
 * `{ [bodyKey]: records[] }` and answers `{ results: [{ id, status, errors? }] }`, one per record,
 * in order (the contract of POST /api/sync).
 */
export const COLLECTIONS: { name: string; path: string; bodyKey: string }[] = [
  { name: 'observations', path: '/api/sync', bodyKey: 'observations' },
  { name: 'flags', path: '/api/sync/flags', bodyKey: 'flags' },
  // After observations: a task update may name the note observation that carries its photos.
  { name: 'task-updates', path: '/api/sync/task-updates', bodyKey: 'taskUpdates' },
  { name: 'row-work', path: '/api/sync/row-work', bodyKey: 'records' },
];

let engine: SyncEngine | undefined;

function browserSync() {
  return (engine ??= createSyncEngine({
    outbox: browserOutbox(),
    transport: fetchTransport(),
    lock: webLock(SYNC_TAG),
    clock: realClock,
    collections: COLLECTIONS,
    batchSize: SYNC_BATCH_LIMIT,
    online: () => (typeof navigator === 'undefined' ? true : navigator.onLine),
    lastSynced: {
      read: () => Number(localStorage.getItem(LOCAL.lastSynced)) || null,
      write: (at) => localStorage.setItem(LOCAL.lastSynced, String(at)),
    },
  }));
}

export const getSyncStatus = () => browserSync().getStatus();
export const subscribeSyncStatus = (fn: () => void) => browserSync().subscribe(fn);
export const refreshCounts = () => browserSync().refreshCounts();

/** Sends what waits now. Safe to call any time; concurrent calls collapse into one drain. */
export const syncNow = () => browserSync().syncNow();

let listening = false;

/** Starts the sync for the signed-in person; records of other people on this device wait for them. */
export async function startSync(currentOwner: string) {
  const sync = browserSync();
  if (!listening) {
    listening = true;
    window.addEventListener('online', () => void sync.reconnected());
    window.addEventListener('offline', () => sync.disconnected());
    document.addEventListener('visibilitychange', () => {
      if (document.visibilityState === 'visible') void sync.syncNow();
    });
    navigator.serviceWorker?.addEventListener('message', (e) => {
      if (e.data === SYNC_TAG) void sync.syncNow();
    });
  }
  await sync.start(currentOwner);
}

/** Asks the service worker to wake us when the connection returns, where Background Sync exists. */
export async function requestBackgroundSync() {
  const reg = await navigator.serviceWorker?.getRegistration();
  const sync = (reg as (ServiceWorkerRegistration & { sync?: { register(tag: string): Promise<void> } }) | undefined)?.sync;
  await sync?.register(SYNC_TAG).catch(() => undefined);
}
