/**
 * The device's outbox: every record and photo a person saves in the field lives here, in
 * IndexedDB, until the server has acknowledged it. It is a state machine, not a cache:
 *
 *   queued ──drain──▶ sending ──created/duplicate──▶ (deleted)
 *      ▲                 │  └──rejected/conflict──▶ rejected (kept, shown, fixed or discarded by a person)
 *      └─network error, 5xx, 401, timeout──┘
 *
 * Nothing expires and nothing is dropped without an explicit acknowledgement or a person's choice.
 * Entries left "sending" by a crash or a closed tab go back to "queued" on the next start; the
 * server's once-only ids make the resend harmless.
 */
import { createStore, del, entries, get, set, update } from 'idb-keyval';

export type EntryState = 'queued' | 'sending' | 'rejected';

/**
 * What a record is: each collection has its own sync endpoint with the same once-only contract
 * (see COLLECTIONS in lib/offline/sync.ts). Entries saved before collections existed are observations.
 */
export type Collection = 'observations' | (string & {});

export interface ObservationEntry {
  id: string;
  owner: string;
  collection?: Collection;
  record: Record<string, unknown> & { id: string; blockId: string; row: number; position: number; kind?: string };
  state: EntryState;
  attempts: number;
  createdAt: number;
  errors?: { field: string; message: string }[];
  conflict?: boolean;
}

export type PhotoState = 'queued' | 'uploading' | 'uploaded' | 'rejected';

export interface PhotoEntry {
  id: string;
  owner: string;
  observationId: string;
  blob: Blob;
  contentType: string;
  bytes: number;
  takenAt: string;
  state: PhotoState;
  attempts: number;
  createdAt: number;
  error?: string;
}

// One database per store: idb-keyval opens each database with a single object store.
const records = () => createStore('vineward-outbox', 'records');
const photos = () => createStore('vineward-photos', 'photos');

const channel = typeof BroadcastChannel === 'undefined' ? undefined : new BroadcastChannel('vineward-outbox');
const listeners = new Set<() => void>();

export function onOutboxChange(listener: () => void) {
  listeners.add(listener);
  const fromOtherTab = () => listener();
  channel?.addEventListener('message', fromOtherTab);
  return () => {
    listeners.delete(listener);
    channel?.removeEventListener('message', fromOtherTab);
  };
}

function changed() {
  for (const l of listeners) l();
  channel?.postMessage('changed');
}

export async function enqueueRecord(owner: string, collection: Collection, record: ObservationEntry['record']) {
  await set(record.id, { id: record.id, owner, collection, record, state: 'queued', attempts: 0, createdAt: Date.now() } satisfies ObservationEntry, records());
  changed();
}

export const enqueueObservation = (owner: string, record: ObservationEntry['record']) => enqueueRecord(owner, 'observations', record);

export const collectionOf = (e: ObservationEntry): Collection => e.collection ?? 'observations';

export async function enqueuePhoto(entry: Omit<PhotoEntry, 'state' | 'attempts' | 'createdAt'>) {
  await set(entry.id, { ...entry, state: 'queued', attempts: 0, createdAt: Date.now() } satisfies PhotoEntry, photos());
  changed();
}

export async function listObservations(): Promise<ObservationEntry[]> {
  return (await entries<string, ObservationEntry>(records())).map(([, v]) => v).sort((a, b) => a.createdAt - b.createdAt);
}

export async function listPhotos(): Promise<PhotoEntry[]> {
  return (await entries<string, PhotoEntry>(photos())).map(([, v]) => v).sort((a, b) => a.createdAt - b.createdAt);
}

export const getObservationEntry = (id: string) => get<ObservationEntry>(id, records());

export async function patchObservations(ids: string[], patch: Partial<ObservationEntry>) {
  for (const id of ids) await update<ObservationEntry>(id, (e) => (e ? { ...e, ...patch } : (undefined as never)), records());
  changed();
}

export async function patchPhoto(id: string, patch: Partial<PhotoEntry>) {
  await update<PhotoEntry>(id, (e) => (e ? { ...e, ...patch } : (undefined as never)), photos());
  changed();
}

/** Only after the server said created or duplicate, or a person chose to discard it. */
export async function removeObservation(id: string) {
  await del(id, records());
  changed();
}

export async function removePhoto(id: string) {
  await del(id, photos());
  changed();
}

/** A person corrected a rejected record: it goes back in the queue under the same id. */
export async function replaceObservation(record: ObservationEntry['record']) {
  await update<ObservationEntry>(
    record.id,
    (e) => (e ? { ...e, record, state: 'queued', errors: undefined, conflict: undefined } : (undefined as never)),
    records(),
  );
  changed();
}

/**
 * A conflict means the server holds another record under this id: keep the person's record by
 * giving it a new id (and moving its photos along), so both survive.
 */
export async function reissueObservation(oldId: string) {
  const entry = await get<ObservationEntry>(oldId, records());
  if (!entry) return;
  const id = crypto.randomUUID();
  await set(id, { ...entry, id, record: { ...entry.record, id }, state: 'queued', errors: undefined, conflict: undefined }, records());
  await del(oldId, records());
  for (const p of await listPhotos()) {
    if (p.observationId === oldId) await update<PhotoEntry>(p.id, (x) => ({ ...x!, observationId: id }), photos());
  }
  changed();
}

/** After a crash or a closed tab, nothing stays marked as in flight. */
export async function recoverInterrupted() {
  for (const e of await listObservations()) {
    if (e.state === 'sending') await update<ObservationEntry>(e.id, (x) => ({ ...x!, state: 'queued' }), records());
  }
  for (const p of await listPhotos()) {
    if (p.state === 'uploading') await update<PhotoEntry>(p.id, (x) => ({ ...x!, state: 'queued' }), photos());
  }
}
