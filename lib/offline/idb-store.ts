import { createStore, del, entries, get, promisifyRequest, set, type UseStore } from 'idb-keyval';
import { IDB } from '@/lib/device-keys';
import type { OutboxStore, Table } from '@/lib/offline/store';

function idbTable<T extends { id: string }>(store: UseStore): Table<T> {
  return {
    get: (id) => get<T>(id, store),
    // An older version's update of a missing key wrote `undefined` under it; such holes are skipped.
    list: async () => (await entries<string, T | undefined>(store)).flatMap(([, v]) => (v === undefined ? [] : [v])),
    put: (entry) => set(entry.id, entry, store),
    update: (id, change) =>
      store('readwrite', (s) => {
        const read = s.get(id);
        read.onsuccess = () => {
          if (read.result !== undefined) s.put(change(read.result as T), id);
        };
        return promisifyRequest(s.transaction);
      }),
    delete: (id) => del(id, store),
  };
}

/**
 * The phone's outbox in IndexedDB: one database per table, because idb-keyval opens each database
 * with a single object store. The names are what phones in the field already hold.
 */
export function idbStore(prefix: string = IDB.outboxPrefix): OutboxStore {
  return {
    records: idbTable(createStore(`${prefix}-outbox`, 'records')),
    photos: idbTable(createStore(`${prefix}-photos`, 'photos')),
  };
}
