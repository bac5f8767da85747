/**
 * Where the outbox keeps its entries. Two implementations hold to one contract
 * (tests/unit/offline/store-contract.ts): IndexedDB on the phone (idb-store.ts) and memory
 * (memory-store.ts) for tests.
 */
export type EntryState = 'queued' | 'sending' | 'rejected';

/**
 * What a record is: each collection has its own sync endpoint with the same once-only contract
 * (see COLLECTIONS in lib/offline/sync.ts). Entries saved before collections existed are observations.
 */
export type Collection = 'observations' | (string & {});

/** A record waiting to sync, of any collection (observations, flags, task updates, row work). */
export interface RecordEntry {
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

/** One kind of entry, keyed by id. Values come back as copies: changing one changes nothing stored. */
export interface Table<T extends { id: string }> {
  get(id: string): Promise<T | undefined>;
  /** Every entry, in no particular order. */
  list(): Promise<T[]>;
  put(entry: T): Promise<void>;
  /** Changes an entry in one step; an id that is not there stays absent. */
  update(id: string, change: (entry: T) => T): Promise<void>;
  delete(id: string): Promise<void>;
}

export interface OutboxStore {
  records: Table<RecordEntry>;
  photos: Table<PhotoEntry>;
}
