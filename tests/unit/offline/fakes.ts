/**
 * Test parts for the sync engine: a server that keeps the once-only-by-id rule of POST /api/sync
 * (lib/server/services/sync.ts: created, duplicate for the same payload, conflict for another one)
 * and the photo steps, reached through a transport that can fail in each way a phone's network does.
 */
import type { Answer, AnswerBody, Clock, Lock, RecordResult, Transport } from '@/lib/offline/engine';
import { createSyncEngine, type SyncParts } from '@/lib/offline/engine';
import { memoryStore } from '@/lib/offline/memory-store';
import { createOutbox } from '@/lib/offline/queue';
import type { RecordEntry, OutboxStore } from '@/lib/offline/store';
import { COLLECTIONS } from '@/lib/offline/sync';

/** Lets every promise chain that waits on nothing but other promises run to its end. */
export const settle = () => new Promise<void>((resolve) => setImmediate(resolve));

/**
 * What the next request meets: 'ok' is the server's real answer; 'offline' fails before the
 * request leaves; 'timeout' is fetch's abort after its deadline; 'lost' lets the server do the work
 * and then drops the answer; 'hang' never answers (a tab closed mid-request); 'partial' takes and
 * answers for only the first half of a batch.
 */
export type Outcome = 'ok' | 'offline' | 'timeout' | 'lost' | 'hang' | 'partial' | { status: number; json?: AnswerBody };

export const PUT = 'PUT';

interface Stored {
  collection: string;
  payload: string;
  session: string;
  creations: number;
}

export class FakeServer {
  /** Whose session cookie the phone's requests carry; null: signed out (401). */
  session: string | null = 'scout-a';
  readonly records = new Map<string, Stored>();
  readonly photos = new Map<string, { observationId: string; state: 'pending' | 'uploaded' | 'stored'; bytes: number; sessions: string[] }>();
  readonly requests: { path: string; body: unknown; session: string | null }[] = [];
  /** Called as each request arrives, before it is answered. */
  onRequest?: (path: string, body: unknown) => void | Promise<void>;
  private readonly queued = new Map<string, Outcome[]>();

  /** Scripts what the next requests to `path` (PUT for uploads, * for any) meet; then they go through. */
  next(path: string, ...outcomes: Outcome[]) {
    this.queued.set(path, [...(this.queued.get(path) ?? []), ...outcomes]);
  }

  /** Forgets what was scripted. */
  clear() {
    this.queued.clear();
    this.fallback = undefined;
  }

  /** The same outcome for every request until cleared. */
  always(outcome: Outcome | undefined) {
    this.fallback = outcome;
  }
  private fallback: Outcome | undefined;

  readonly transport: Transport = {
    post: (path, body) => this.handle(path, body, (session, partial) => this.answer(path, body, session, partial)),
    put: (url, blob) => this.handle(PUT, { url }, () => this.upload(url, blob)),
  };

  sent(path: string) {
    return this.requests.filter((r) => r.path === path);
  }

  private async handle<T>(path: string, body: unknown, work: (session: string | null, partial: boolean) => T): Promise<T> {
    const outcome = this.queued.get(path)?.shift() ?? this.queued.get('*')?.shift() ?? this.fallback ?? 'ok';
    if (outcome === 'offline') throw new TypeError('Failed to fetch');
    if (outcome === 'timeout') throw new DOMException('The operation was aborted due to timeout', 'TimeoutError');
    if (outcome === 'hang') return new Promise<T>(() => {});
    // The cookie is read as the request leaves, whatever happens on the phone meanwhile.
    const session = this.session;
    this.requests.push({ path, body, session });
    await this.onRequest?.(path, body);
    if (typeof outcome === 'object') return { status: outcome.status, json: outcome.json } as T;
    const answer = work(session, outcome === 'partial');
    if (outcome === 'lost') throw new TypeError('Failed to fetch');
    return answer;
  }

  private answer(path: string, body: unknown, session: string | null, partial = false): Answer {
    if (session === null) return { status: 401, json: { error: { code: 'unauthorised', message: 'Sign in first.' } } };
    const collection = COLLECTIONS.find((c) => c.path === path);
    if (collection) {
      const all = (body as Record<string, RecordEntry['record'][]>)[collection.bodyKey]!;
      const list = partial ? all.slice(0, Math.ceil(all.length / 2)) : all;
      return { status: 200, json: { results: list.map((r) => this.receive(collection.name, r, session)) } };
    }
    const { id, observationId, bytes } = body as { id: string; observationId: string; bytes: number };
    if (path === '/api/photos/presign') {
      if (!this.records.has(observationId)) return { status: 422, json: { error: { code: 'invalid-input', message: 'No such observation.' } } };
      if (this.photos.get(id)?.state === 'stored') return { status: 200, json: { status: 'stored' } };
      this.photos.set(id, { observationId, state: 'pending', bytes, sessions: [...(this.photos.get(id)?.sessions ?? []), session] });
      return { status: 200, json: { status: 'pending', uploadUrl: `http://s3.test/photos/${id}` } };
    }
    if (path === '/api/photos/confirm') {
      const photo = this.photos.get(id);
      photo?.sessions.push(session);
      if (photo?.state === 'stored') return { status: 200, json: { status: 'stored' } };
      if (photo?.state !== 'uploaded') return { status: 409, json: { error: { code: 'not-uploaded', message: 'The photo has not arrived yet.' } } };
      photo.state = 'stored';
      return { status: 200, json: { status: 'stored' } };
    }
    return { status: 404, json: { error: { code: 'not-found', message: 'No such route.' } } };
  }

  private receive(collection: string, record: RecordEntry['record'], session: string): RecordResult {
    const payload = JSON.stringify(record);
    const held = this.records.get(record.id);
    if (held) return { id: record.id, status: held.payload === payload ? 'duplicate' : 'conflict' };
    if ((record.data as { budsRetained?: number } | undefined)?.budsRetained === -1) {
      return { id: record.id, status: 'rejected', errors: [{ field: 'data.budsRetained', message: 'Must be 0 or more.' }] };
    }
    this.records.set(record.id, { collection, payload, session, creations: 1 });
    return { id: record.id, status: 'created' };
  }

  private upload(url: string, blob: Blob) {
    const photo = this.photos.get(url.split('/').pop()!);
    if (!photo) return { status: 403 };
    photo.state = 'uploaded';
    photo.bytes = blob.size;
    return { status: 200 };
  }
}

export function fakeClock(start = Date.UTC(2026, 1, 10, 8)) {
  let now = start;
  const timers = new Set<{ at: number; fn: () => void }>();
  const clock: Clock = {
    now: () => now,
    later(fn, ms) {
      const timer = { at: now + ms, fn };
      timers.add(timer);
      return () => timers.delete(timer);
    },
  };
  return {
    clock,
    /** Moves time on, fires what fell due, and lets it finish. */
    async advance(ms: number) {
      now += ms;
      for (const timer of [...timers].sort((a, b) => a.at - b.at)) {
        if (timer.at <= now) {
          timers.delete(timer);
          timer.fn();
        }
      }
      await settle();
    },
    pending: () => timers.size,
  };
}

/** One drain at a time within one engine, as Web Locks give across tabs. */
export function localLock(): Lock {
  let busy = false;
  return {
    async ifFree(fn) {
      if (busy) return;
      busy = true;
      try {
        await fn();
      } finally {
        busy = false;
      }
    },
  };
}

export const BLOCK = '0b10c4a0-0000-4000-8000-000000000001';

export const uuid = (n: number) => `00000000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;

export const record = (n: number, data: Record<string, unknown> = { budsRetained: 24, budsPushed: 12 }): RecordEntry['record'] => ({
  id: uuid(n),
  blockId: BLOCK,
  row: 5,
  position: n,
  kind: 'budbreak',
  data,
});

export const jpeg = (bytes: number) => new Blob([new Uint8Array(bytes)], { type: 'image/jpeg' });

let ids = 1_000_000;

/** An engine over `store` (a new one unless given: a reload passes the old one). */
export function setup(options: { store?: OutboxStore; server?: FakeServer; batchSize?: number; online?: () => boolean } = {}) {
  const store = options.store ?? memoryStore();
  const server = options.server ?? new FakeServer();
  const time = fakeClock();
  const outbox = createOutbox(store, { now: time.clock.now, newId: () => uuid(ids++) });
  let lastSynced: number | null = null;
  const parts: SyncParts = {
    outbox,
    transport: server.transport,
    lock: localLock(),
    clock: time.clock,
    collections: COLLECTIONS,
    batchSize: options.batchSize ?? 200,
    online: options.online,
    random: () => 0.5, // no jitter: back-off delays come out exact
    lastSynced: { read: () => lastSynced, write: (at) => void (lastSynced = at) },
  };
  const engine = createSyncEngine(parts);
  return { store, server, outbox, engine, time, lastSynced: () => lastSynced };
}
