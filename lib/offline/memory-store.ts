import type { OutboxStore, Table } from '@/lib/offline/store';

function memoryTable<T extends { id: string }>(): Table<T> {
  const rows = new Map<string, T>();
  // Copies in and out, as IndexedDB's structured clone does.
  return {
    get: async (id) => (rows.has(id) ? structuredClone(rows.get(id)) : undefined),
    list: async () => [...rows.values()].map((v) => structuredClone(v)),
    put: async (entry) => void rows.set(entry.id, structuredClone(entry)),
    update: async (id, change) => {
      const current = rows.get(id);
      if (current !== undefined) rows.set(id, structuredClone(change(structuredClone(current))));
    },
    delete: async (id) => void rows.delete(id),
  };
}

/** An outbox that lives as long as the object: for tests, and wherever IndexedDB is missing. */
export const memoryStore = (): OutboxStore => ({ records: memoryTable(), photos: memoryTable() });
