/**
 * Drains the outbox to the server: record collections first (oldest first, in batches), then photos
 * (presign → PUT straight to object storage → confirm). Built from its parts, with no state outside
 * the engine: the browser wiring (IndexedDB, fetch, Web Locks, real timers) is in sync.ts, tests
 * pass fakes. Runs on start, on reconnect, on a timer with exponential back-off while anything
 * waits, and on demand; the status for the status bar is kept here.
 */
import type { SyncResult } from '@/lib/contracts/sync';
import type { Outbox } from '@/lib/offline/queue';
import type { RecordEntry, PhotoEntry } from '@/lib/offline/store';
import { collectionOf } from '@/lib/offline/queue';

/** What the app's API answers; `json` is undefined when the body was not JSON. */
export interface Answer {
  status: number;
  json: AnswerBody | undefined;
}

export interface AnswerBody {
  error?: { code?: string; message?: string };
  results?: RecordResult[];
  status?: string;
  uploadUrl?: string;
}

/** The server's answer for one record (lib/contracts/sync.ts). */
export type RecordResult = SyncResult;

export interface Transport {
  /** POSTs JSON to the app's API; throws when no answer came (no network, timeout, connection lost). */
  post(path: string, body: unknown): Promise<Answer>;
  /** PUTs a photo straight to object storage; throws when the upload broke off. */
  put(url: string, blob: Blob, contentType: string, onProgress: (loaded: number) => void): Promise<{ status: number }>;
}

/** One drain at a time (across tabs, in the browser). */
export interface Lock {
  /** Runs `fn` unless another drain holds the lock; then it returns without running it. */
  ifFree(fn: () => Promise<void>): Promise<void>;
}

export interface Clock {
  now(): number;
  /** Calls `fn` after `ms`; answers a function that cancels it. */
  later(fn: () => void, ms: number): () => void;
}

/**
 * A record collection: its endpoint takes `{ [bodyKey]: records[] }` and answers
 * `{ results: [{ id, status, errors? }] }`, one per record, in order (the contract of POST /api/sync).
 */
export interface CollectionRoute {
  name: string;
  path: string;
  bodyKey: string;
}

export interface SyncParts {
  outbox: Outbox;
  transport: Transport;
  lock: Lock;
  clock: Clock;
  /** Drained in this order, before photos. */
  collections: readonly CollectionRoute[];
  batchSize: number;
  /** What the device believes about its connection (navigator.onLine in the browser). */
  online?: () => boolean;
  /** For the back-off's jitter. */
  random?: () => number;
  /** Where the time of the last good drain is kept between page loads. */
  lastSynced?: { read(): number | null; write(at: number): void };
}

export interface SyncStatus {
  online: boolean;
  running: boolean;
  /** False until this phone's outbox has been read once: until then the counts below mean nothing. */
  counted: boolean;
  waiting: number;
  photosWaiting: number;
  rejected: RecordEntry[];
  rejectedPhotos: PhotoEntry[];
  otherOwners: number;
  progress: { records: number; recordsTotal: number; bytes: number; bytesTotal: number } | null;
  lastSyncedAt: number | null;
  signedOut: boolean;
  problem: string | null;
  nextAttemptAt: number | null;
}

const MAX_BACKOFF_MS = 5 * 60_000;

/** 4xx but 408 (request timeout) and 429 (too many requests), which mean "later"; 401 is handled apart. */
const refusal = (status: number) => status >= 400 && status < 500 && status !== 408 && status !== 429;
const IDLE_INTERVAL_MS = 60_000;

export class Stop extends Error {
  constructor(
    readonly reason: 'signed-out' | 'offline' | 'server',
    message: string,
  ) {
    super(message);
  }
}

export function createSyncEngine(parts: SyncParts) {
  const { outbox, transport, lock, clock, collections, batchSize } = parts;
  const online = parts.online ?? (() => true);
  const random = parts.random ?? Math.random;

  let status: SyncStatus = {
    online: online(),
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
  let owner = '';
  let failures = 0;
  let cancelTimer: (() => void) | undefined;
  let started = false;

  function setStatus(patch: Partial<SyncStatus>) {
    status = { ...status, ...patch };
    for (const fn of subscribers) fn();
  }

  async function refreshCounts() {
    const [obs, pics] = await Promise.all([outbox.listObservations(), outbox.listPhotos()]);
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

  async function post(path: string, body: unknown) {
    let answer: Answer;
    try {
      answer = await transport.post(path, body);
    } catch {
      throw new Stop('offline', 'No connection to Vineward right now.');
    }
    if (answer.status === 401) throw new Stop('signed-out', 'Sign in again to send what is waiting. Nothing is lost.');
    // A login page or proxy answering 200 with HTML must not count as an acknowledgement.
    if (answer.status >= 500 || answer.json === undefined) throw new Stop('server', 'Vineward did not answer properly; will try again.');
    return { status: answer.status, json: answer.json };
  }

  async function sendBatch(collection: CollectionRoute, batch: RecordEntry[]) {
    const ids = batch.map((e) => e.id);
    await outbox.patchObservations(ids, { state: 'sending' });
    let answer: Awaited<ReturnType<typeof post>>;
    try {
      answer = await post(collection.path, { [collection.bodyKey]: batch.map((e) => e.record) });
    } catch (err) {
      await outbox.patchObservations(ids, { state: 'queued' });
      throw err;
    }
    if (answer.status === 413 && batch.length > 1) {
      // Too large together is not too large apart: halves, down to the one record that is.
      await outbox.patchObservations(ids, { state: 'queued' });
      const half = Math.ceil(batch.length / 2);
      await sendBatch(collection, batch.slice(0, half));
      return sendBatch(collection, batch.slice(half));
    }
    if (answer.status !== 200) {
      const message = answer.json.error?.message ?? `The server refused the batch (${answer.status}).`;
      // A "no" to the whole request (too large, too many, not allowed) does not change on a resend:
      // each record shows the server's reason, for a person to fix or discard.
      if (refusal(answer.status)) return outbox.patchObservations(ids, { state: 'rejected', errors: [{ field: 'batch', message }] });
      await outbox.patchObservations(ids, { state: 'queued' });
      throw new Stop('server', message);
    }
    const results = answer.json.results;
    if (!Array.isArray(results)) {
      await outbox.patchObservations(ids, { state: 'queued' });
      throw new Stop('server', 'Vineward did not answer properly; will try again.');
    }
    const settled = new Set<string>();
    try {
      for (const [i, result] of results.entries()) {
        const entry = batch[i];
        // Results come in order, one per record; one that names another id settles nothing.
        if (!entry || result?.id !== entry.id) continue;
        if (result.status === 'created' || result.status === 'duplicate') await outbox.removeObservation(entry.id);
        else if (result.status === 'conflict') {
          await outbox.patchObservations([entry.id], {
            state: 'rejected',
            conflict: true,
            errors: [{ field: 'id', message: 'A different record with this id is already on the server.' }],
          });
        } else await outbox.patchObservations([entry.id], { state: 'rejected', errors: result.errors ?? [] });
        settled.add(entry.id);
      }
    } finally {
      // Anything not settled (no answer for it, or the store failed midway) goes back to queued, never left "sending".
      const rest = ids.filter((id) => !settled.has(id));
      if (rest.length) await outbox.patchObservations(rest, { state: 'queued' });
    }
  }

  async function put(url: string, photo: PhotoEntry, onBytes: (n: number) => void) {
    let answer: { status: number };
    try {
      answer = await transport.put(url, photo.blob, photo.contentType, onBytes);
    } catch {
      throw new Stop('offline', 'The photo upload was interrupted; will try again.');
    }
    if (answer.status < 200 || answer.status >= 300) throw new Stop('server', `Storage refused the upload (${answer.status}).`);
  }

  async function sendPhoto(photo: PhotoEntry, pendingObservations: Set<string>, ownerChanged: () => boolean, onBytes: (n: number) => void) {
    // A photo waits for its observation: the server only accepts photos of stored observations.
    if (pendingObservations.has(photo.observationId)) return;
    await outbox.patchPhoto(photo.id, { state: 'uploading' });
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
          // Only a lasting "no" rejects the photo; 408, 429 and the like mean try later (the catch below re-queues).
          if (!refusal(presign.status)) throw new Stop('server', presign.json.error?.message ?? `Vineward answered ${presign.status}; will try again.`);
          await outbox.patchPhoto(photo.id, { state: 'rejected', error: presign.json.error?.message ?? 'The server refused this photo.' });
          return;
        }
        if (presign.json.status === 'pending') await put(presign.json.uploadUrl!, photo, onBytes);
        await outbox.patchPhoto(photo.id, { state: 'uploaded' });
      }
      // The upload went under its owner's session; its confirm must too, in their next drain.
      if (ownerChanged()) return outbox.patchPhoto(photo.id, { state: 'uploaded' });
      const confirm = await post('/api/photos/confirm', { id: photo.id });
      if (confirm.status === 200) await outbox.removePhoto(photo.id);
      else if (confirm.status === 409) await outbox.patchPhoto(photo.id, { state: 'queued', attempts: photo.attempts + 1 });
      else if (!refusal(confirm.status)) throw new Stop('server', confirm.json.error?.message ?? `Vineward answered ${confirm.status}; will try again.`);
      else await outbox.patchPhoto(photo.id, { state: 'rejected', error: confirm.json.error?.message ?? 'The server refused this photo.' });
    } catch (err) {
      const current = await outbox.getPhotoEntry(photo.id);
      if (current?.state === 'uploading') {
        await outbox.patchPhoto(photo.id, { state: photo.state === 'uploaded' ? 'uploaded' : 'queued', attempts: photo.attempts + 1 });
      }
      throw err;
    }
  }

  /** Answers whether it reached the server (nothing to send means nothing was asked). */
  async function drainOnce(): Promise<boolean> {
    const drainOwner = owner;
    // Another person signed in on this phone meanwhile: the requests now carry their session.
    const ownerChanged = () => owner !== drainOwner;
    const { obs, pics } = await refreshCounts();
    const queued = obs.filter((o) => o.state === 'queued');
    const photos = pics.filter((p) => p.state === 'queued' || p.state === 'uploaded');
    if (queued.length === 0 && photos.length === 0) return false;
    const bytesTotal = photos.reduce((s, p) => s + p.bytes, 0);
    const progress = { records: 0, recordsTotal: queued.length, bytes: 0, bytesTotal };
    setStatus({ progress });
    for (const collection of collections) {
      const ofCollection = queued.filter((e) => collectionOf(e) === collection.name);
      for (let i = 0; i < ofCollection.length; i += batchSize) {
        if (ownerChanged()) return true;
        const batch = ofCollection.slice(i, i + batchSize);
        await sendBatch(collection, batch);
        progress.records += batch.length;
        setStatus({ progress: { ...progress } });
      }
    }
    const pending = new Set((await outbox.listObservations()).map((o) => o.id));
    for (const photo of photos) {
      if (ownerChanged()) return true;
      const before = progress.bytes;
      await sendPhoto(photo, pending, ownerChanged, (loaded) => setStatus({ progress: { ...progress, bytes: before + loaded } }));
      progress.bytes = before + photo.bytes;
      setStatus({ progress: { ...progress } });
    }
    return true;
  }

  function schedule(delayMs: number) {
    cancelTimer?.();
    setStatus({ nextAttemptAt: clock.now() + delayMs });
    cancelTimer = clock.later(() => void syncNow(), delayMs);
  }

  /** Sends what waits now. Safe to call any time; concurrent calls collapse into one drain. */
  async function syncNow() {
    if (!owner) return;
    await lock.ifFree(async () => {
      setStatus({ running: true, problem: null });
      try {
        const reached = await drainOnce();
        failures = 0;
        if (reached) {
          const now = clock.now();
          parts.lastSynced?.write(now);
          setStatus({ lastSyncedAt: now, signedOut: false, online: true });
        }
      } catch (err) {
        failures++;
        const stop = err instanceof Stop ? err : new Stop('server', String(err));
        setStatus({ problem: stop.message, signedOut: stop.reason === 'signed-out', online: stop.reason !== 'offline' && online() });
      } finally {
        setStatus({ running: false, progress: null });
        const { obs, pics } = await refreshCounts();
        const left = obs.some((o) => o.state === 'queued') || pics.some((p) => p.state === 'queued' || p.state === 'uploaded');
        if (left) {
          const backoff = Math.min(MAX_BACKOFF_MS, 2000 * 2 ** Math.max(0, failures - 1));
          schedule(failures ? backoff * (0.75 + random() * 0.5) : 1000);
        } else schedule(IDLE_INTERVAL_MS);
      }
    });
  }

  return {
    getStatus: () => status,
    subscribe(fn: () => void) {
      subscribers.add(fn);
      return () => subscribers.delete(fn);
    },
    refreshCounts,
    syncNow,

    /**
     * Starts the sync for the signed-in person; records of other people on this device wait for
     * them. Resolves when the first drain is over.
     */
    async start(currentOwner: string) {
      owner = currentOwner;
      setStatus({ online: online(), lastSyncedAt: parts.lastSynced?.read() ?? null });
      if (!started) {
        started = true;
        await outbox.recoverInterrupted();
      }
      await refreshCounts();
      await syncNow();
    },

    /** The connection came back: try now, and start the back-off afresh. */
    reconnected() {
      failures = 0;
      setStatus({ online: true });
      return syncNow();
    },

    disconnected() {
      setStatus({ online: false });
    },

    /** No more timers (a closed page, a test that is over). */
    stop() {
      cancelTimer?.();
      cancelTimer = undefined;
    },
  };
}

export type SyncEngine = ReturnType<typeof createSyncEngine>;
