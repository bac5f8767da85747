/**
 * The device's outbox: every record and photo a person saves in the field lives here until the
 * server has acknowledged it. It is a state machine, not a cache:
 *
 *   queued ──drain──▶ sending ──created/duplicate──▶ (deleted)
 *      ▲                 │  └──rejected/conflict, or the whole batch refused (4xx)──▶ rejected
 *      │                 │        (kept, shown, fixed or discarded by a person)
 *      └─network error, 5xx, 401, 408, 429, timeout──┘
 *
 * Nothing expires and nothing is dropped without an explicit acknowledgement or a person's choice.
 * Entries left "sending" by a crash or a closed tab go back to "queued" on the next start; the
 * server's once-only ids make the resend harmless.
 */
import type { Collection, RecordEntry, OutboxStore, PhotoEntry } from '@/lib/offline/store';

export interface OutboxOptions {
  /** Tells the other tabs of this phone that the outbox changed, and hears theirs. */
  channel?: { post(): void; listen(fn: () => void): () => void };
  now?: () => number;
  newId?: () => string;
}

// Same createdAt (one millisecond): by id, the order IndexedDB lists keys in.
const oldestFirst = <T extends { id: string; createdAt: number }>(list: T[]) =>
  list.sort((a, b) => a.createdAt - b.createdAt || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));

export const collectionOf = (e: RecordEntry): Collection => e.collection ?? 'observations';

export function createOutbox(store: OutboxStore, options: OutboxOptions = {}) {
  const now = options.now ?? Date.now;
  const newId = options.newId ?? (() => crypto.randomUUID());
  const listeners = new Set<() => void>();
  const { records, photos } = store;

  function changed() {
    for (const l of listeners) l();
    options.channel?.post();
  }

  const outbox = {
    onChange(listener: () => void) {
      listeners.add(listener);
      const unlisten = options.channel?.listen(() => listener());
      return () => {
        listeners.delete(listener);
        unlisten?.();
      };
    },

    async enqueueRecord(owner: string, collection: Collection, record: RecordEntry['record']) {
      await records.put({ id: record.id, owner, collection, record, state: 'queued', attempts: 0, createdAt: now() });
      changed();
    },

    enqueueObservation: (owner: string, record: RecordEntry['record']) => outbox.enqueueRecord(owner, 'observations', record),

    async enqueuePhoto(entry: Omit<PhotoEntry, 'state' | 'attempts' | 'createdAt'>) {
      await photos.put({ ...entry, state: 'queued', attempts: 0, createdAt: now() });
      changed();
    },

    listObservations: async (): Promise<RecordEntry[]> => oldestFirst(await records.list()),
    listPhotos: async (): Promise<PhotoEntry[]> => oldestFirst(await photos.list()),
    getObservationEntry: (id: string) => records.get(id),
    getPhotoEntry: (id: string) => photos.get(id),

    async patchObservations(ids: string[], patch: Partial<RecordEntry>) {
      for (const id of ids) await records.update(id, (e) => ({ ...e, ...patch }));
      changed();
    },

    async patchPhoto(id: string, patch: Partial<PhotoEntry>) {
      await photos.update(id, (e) => ({ ...e, ...patch }));
      changed();
    },

    /** Only after the server said created or duplicate, or a person chose to discard it. */
    async removeObservation(id: string) {
      await records.delete(id);
      changed();
    },

    async removePhoto(id: string) {
      await photos.delete(id);
      changed();
    },

    /** A person corrected a rejected record: it goes back in the queue under the same id. */
    async replaceObservation(record: RecordEntry['record']) {
      await records.update(record.id, (e) => ({ ...e, record, state: 'queued', errors: undefined, conflict: undefined }));
      changed();
    },

    /**
     * A conflict means the server holds another record under this id: keep the person's record by
     * giving it a new id (and moving its photos along), so both survive.
     */
    async reissueObservation(oldId: string) {
      const entry = await records.get(oldId);
      if (!entry) return;
      const id = newId();
      await records.put({ ...entry, id, record: { ...entry.record, id }, state: 'queued', errors: undefined, conflict: undefined });
      await records.delete(oldId);
      for (const p of await photos.list()) {
        if (p.observationId === oldId) await photos.update(p.id, (x) => ({ ...x, observationId: id }));
      }
      changed();
    },

    /** After a crash or a closed tab, nothing stays marked as in flight. */
    async recoverInterrupted() {
      for (const e of await records.list()) {
        if (e.state === 'sending') await records.update(e.id, (x) => ({ ...x, state: 'queued' }));
      }
      for (const p of await photos.list()) {
        if (p.state === 'uploading') await photos.update(p.id, (x) => ({ ...x, state: 'queued' }));
      }
    },
  };
  return outbox;
}

export type Outbox = ReturnType<typeof createOutbox>;
