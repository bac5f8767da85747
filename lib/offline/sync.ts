/**
 * Drains the outbox to the server: observations first (oldest first, in batches), then photos
 * (presign → PUT straight to object storage → confirm). One drain at a time across tabs (Web
 * Locks). Runs on start, on reconnect, on a timer with exponential back-off while anything waits,
 * and on demand. Status for the status bar is kept here.
 */
import {
  collectionOf,
  listObservations,
  listPhotos,
  patchObservations,
  patchPhoto,
  recoverInterrupted,
  removeObservation,
  removePhoto,
  type ObservationEntry,
  type PhotoEntry,
} from '@/lib/offline/outbox';

export const BATCH_SIZE = 200;

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
const REQUEST_TIMEOUT_MS = 30_000;
const MAX_BACKOFF_MS = 5 * 60_000;
const IDLE_INTERVAL_MS = 60_000;

export interface SyncStatus {
  online: boolean;
  running: boolean;
  /** False until this phone's outbox has been read once: until then the counts below mean nothing. */
  counted: boolean;
  waiting: number;
  photosWaiting: number;
  rejected: ObservationEntry[];
  rejectedPhotos: PhotoEntry[];
  otherOwners: number;
  progress: { records: number; recordsTotal: number; bytes: number; bytesTotal: number } | null;
  lastSyncedAt: number | null;
  signedOut: boolean;
  problem: string | null;
  nextAttemptAt: number | null;
}

let status: SyncStatus = {
  online: typeof navigator === 'undefined' ? true : navigator.onLine,
  running: false,
  counted: false,
  waiting: 0,
  photosWaiting: 0,
  rejected: [],
  rejectedPhotos: [],
  otherOwners: 0,
  progress: null,
  lastSyncedAt: null,
  signedOut: false,
  problem: null,
  nextAttemptAt: null,
};
const subscribers = new Set<() => void>();

export const getSyncStatus = () => status;
export function subscribeSyncStatus(fn: () => void) {
  subscribers.add(fn);
  return () => subscribers.delete(fn);
}
function setStatus(patch: Partial<SyncStatus>) {
  status = { ...status, ...patch };
  for (const fn of subscribers) fn();
}

let owner = '';
let failures = 0;
let timer: ReturnType<typeof setTimeout> | undefined;

export async function refreshCounts() {
  const [obs, pics] = await Promise.all([listObservations(), listPhotos()]);
  const mine = obs.filter((o) => o.owner === owner);
  const myPhotos = pics.filter((p) => p.owner === owner);
  setStatus({
    counted: true,
    waiting: mine.filter((o) => o.state !== 'rejected').length,
    photosWaiting: myPhotos.filter((p) => p.state !== 'rejected').length,
    rejected: mine.filter((o) => o.state === 'rejected'),
    rejectedPhotos: myPhotos.filter((p) => p.state === 'rejected'),
    otherOwners: obs.length - mine.length + pics.length - myPhotos.length,
  });
  return { obs: mine, pics: myPhotos };
}

class Stop extends Error {
  constructor(readonly reason: 'signed-out' | 'offline' | 'server', message: string) {
    super(message);
  }
}

async function post(path: string, body: unknown) {
  let res: Response;
  try {
    res = await fetch(path, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(body),
      credentials: 'same-origin',
      signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
    });
  } catch {
    throw new Stop('offline', 'No connection to Vineward right now.');
  }
  if (res.status === 401) throw new Stop('signed-out', 'Sign in again to send what is waiting. Nothing is lost.');
  // A login page or proxy answering 200 with HTML must not count as an acknowledgement.
  const json = res.headers.get('content-type')?.includes('application/json') ? await res.json().catch(() => undefined) : undefined;
  if (res.status >= 500 || json === undefined) throw new Stop('server', 'Vineward did not answer properly; will try again.');
  return { status: res.status, json };
}

async function sendBatch(collection: (typeof COLLECTIONS)[number], batch: ObservationEntry[]) {
  await patchObservations(batch.map((e) => e.id), { state: 'sending' });
  let answer: Awaited<ReturnType<typeof post>>;
  try {
    answer = await post(collection.path, { [collection.bodyKey]: batch.map((e) => e.record) });
  } catch (err) {
    await patchObservations(batch.map((e) => e.id), { state: 'queued' });
    throw err;
  }
  if (answer.status !== 200) {
    await patchObservations(batch.map((e) => e.id), { state: 'queued' });
    throw new Stop('server', answer.json?.error?.message ?? `The server refused the batch (${answer.status}).`);
  }
  const results = answer.json.results as { id: string; status: string; errors?: { field: string; message: string }[] }[];
  for (const [i, result] of results.entries()) {
    const entry = batch[i]!;
    if (result.status === 'created' || result.status === 'duplicate') await removeObservation(entry.id);
    else if (result.status === 'conflict') {
      await patchObservations([entry.id], { state: 'rejected', conflict: true, errors: [{ field: 'id', message: 'A different record with this id is already on the server.' }] });
    } else await patchObservations([entry.id], { state: 'rejected', errors: result.errors ?? [] });
  }
  // Anything the server did not answer for stays queued.
  for (const entry of batch.slice(results.length)) await patchObservations([entry.id], { state: 'queued' });
}

function putWithProgress(url: string, blob: Blob, contentType: string, onProgress: (loaded: number) => void) {
  return new Promise<void>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('PUT', url);
    xhr.setRequestHeader('content-type', contentType);
    xhr.timeout = 120_000;
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? resolve() : reject(new Stop('server', `Storage refused the upload (${xhr.status}).`)));
    xhr.onerror = xhr.ontimeout = () => reject(new Stop('offline', 'The photo upload was interrupted; will try again.'));
    xhr.send(blob);
  });
}

async function sendPhoto(photo: PhotoEntry, pendingObservations: Set<string>, onBytes: (n: number) => void) {
  // A photo waits for its observation: the server only accepts photos of stored observations.
  if (pendingObservations.has(photo.observationId)) return;
  await patchPhoto(photo.id, { state: 'uploading' });
  try {
    if (photo.state !== 'uploaded') {
      const presign = await post('/api/photos/presign', {
        id: photo.id,
        observationId: photo.observationId,
        contentType: photo.contentType,
        bytes: photo.bytes,
        takenAt: photo.takenAt,
      });
      if (presign.status !== 200) {
        await patchPhoto(photo.id, { state: 'rejected', error: presign.json?.error?.message ?? 'The server refused this photo.' });
        return;
      }
      if (presign.json.status === 'pending') {
        await putWithProgress(presign.json.uploadUrl, photo.blob, photo.contentType, onBytes);
      }
      await patchPhoto(photo.id, { state: 'uploaded' });
    }
    const confirm = await post('/api/photos/confirm', { id: photo.id });
    if (confirm.status === 200) await removePhoto(photo.id);
    else if (confirm.status === 409) await patchPhoto(photo.id, { state: 'queued', attempts: photo.attempts + 1 });
    else await patchPhoto(photo.id, { state: 'rejected', error: confirm.json?.error?.message ?? 'The server refused this photo.' });
  } catch (err) {
    const current = (await listPhotos()).find((p) => p.id === photo.id);
    if (current?.state === 'uploading') await patchPhoto(photo.id, { state: photo.state === 'uploaded' ? 'uploaded' : 'queued', attempts: photo.attempts + 1 });
    throw err;
  }
}

/** Answers whether it reached the server (nothing to send means nothing was asked). */
async function drainOnce(): Promise<boolean> {
  const { obs, pics } = await refreshCounts();
  const queued = obs.filter((o) => o.state === 'queued');
  const photos = pics.filter((p) => p.state === 'queued' || p.state === 'uploaded');
  if (queued.length === 0 && photos.length === 0) return false;
  const bytesTotal = photos.reduce((s, p) => s + p.bytes, 0);
  const progress = { records: 0, recordsTotal: queued.length, bytes: 0, bytesTotal };
  setStatus({ progress });
  for (const collection of COLLECTIONS) {
    const ofCollection = queued.filter((e) => collectionOf(e) === collection.name);
    for (let i = 0; i < ofCollection.length; i += BATCH_SIZE) {
      const batch = ofCollection.slice(i, i + BATCH_SIZE);
      await sendBatch(collection, batch);
      progress.records += batch.length;
      setStatus({ progress: { ...progress } });
    }
  }
  const pending = new Set((await listObservations()).map((o) => o.id));
  for (const photo of photos) {
    const before = progress.bytes;
    await sendPhoto(photo, pending, (loaded) => setStatus({ progress: { ...progress, bytes: before + loaded } }));
    progress.bytes = before + photo.bytes;
    setStatus({ progress: { ...progress } });
  }
  return true;
}

function schedule(delayMs: number) {
  clearTimeout(timer);
  setStatus({ nextAttemptAt: Date.now() + delayMs });
  timer = setTimeout(() => void syncNow(), delayMs);
}

async function withLock(fn: () => Promise<void>) {
  if (typeof navigator !== 'undefined' && navigator.locks) {
    await navigator.locks.request('vineward-sync', { ifAvailable: true }, async (lock) => {
      if (lock) await fn();
    });
  } else if (!status.running) {
    await fn();
  }
}

/** Sends what waits now. Safe to call any time; concurrent calls collapse into one drain. */
export async function syncNow() {
  if (!owner) return;
  await withLock(async () => {
    setStatus({ running: true, problem: null });
    try {
      const reached = await drainOnce();
      failures = 0;
      if (reached) {
        const now = Date.now();
        localStorage.setItem('vineward-last-synced', String(now));
        setStatus({ lastSyncedAt: now, signedOut: false, online: true });
      }
    } catch (err) {
      failures++;
      const stop = err instanceof Stop ? err : new Stop('server', String(err));
      setStatus({ problem: stop.message, signedOut: stop.reason === 'signed-out', online: stop.reason !== 'offline' && navigator.onLine });
    } finally {
      setStatus({ running: false, progress: null });
      const { obs, pics } = await refreshCounts();
      const left = obs.some((o) => o.state === 'queued') || pics.some((p) => p.state === 'queued' || p.state === 'uploaded');
      if (left) {
        const backoff = Math.min(MAX_BACKOFF_MS, 2000 * 2 ** Math.max(0, failures - 1));
        schedule(failures ? backoff * (0.75 + Math.random() * 0.5) : 1000);
      } else schedule(IDLE_INTERVAL_MS);
    }
  });
}

let started = false;

/** Starts the sync for the signed-in person; records of other people on this device wait for them. */
export async function startSync(currentOwner: string) {
  owner = currentOwner;
  setStatus({ online: navigator.onLine, lastSyncedAt: Number(localStorage.getItem('vineward-last-synced')) || null });
  if (!started) {
    started = true;
    await recoverInterrupted();
    window.addEventListener('online', () => {
      failures = 0;
      setStatus({ online: true });
      void syncNow();
    });
    window.addEventListener('offline', () => setStatus({ online: false }));
    document.addEventListener('visibilitychange', () => {
      if (document.visibilityState === 'visible') void syncNow();
    });
    navigator.serviceWorker?.addEventListener('message', (e) => {
      if (e.data === 'vineward-sync') void syncNow();
    });
  }
  await refreshCounts();
  void syncNow();
}

/** Asks the service worker to wake us when the connection returns, where Background Sync exists. */
export async function requestBackgroundSync() {
  const reg = await navigator.serviceWorker?.getRegistration();
  const sync = (reg as (ServiceWorkerRegistration & { sync?: { register(tag: string): Promise<void> } }) | undefined)?.sync;
  await sync?.register('vineward-sync').catch(() => undefined);
}
