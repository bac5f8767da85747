import 'fake-indexeddb/auto';
import { createStore, set, update } from 'idb-keyval';
import { describe, expect, it } from 'vitest';
import { idbStore } from '@/lib/offline/idb-store';
import { memoryStore } from '@/lib/offline/memory-store';
import { entry, photoEntry, storeContract } from './store-contract';

let n = 0;
storeContract('in memory', memoryStore);
// fake-indexeddb: IndexedDB as the W3C tests define it, in Node. Each test gets its own databases.
storeContract('IndexedDB (idb-keyval)', () => idbStore(`contract-${n++}`));

describe('the IndexedDB store on a phone', () => {
  it('outlives the page: a store opened again over the same databases holds the entries', async () => {
    await idbStore('reload').records.put(entry('a'));
    await idbStore('reload').photos.put(photoEntry('p'));
    expect(await idbStore('reload').records.get('a')).toEqual(entry('a'));
    expect((await idbStore('reload').photos.get('p'))!.bytes).toBe(7);
  });

  it('reads the databases phones already hold, as the previous outbox wrote them', async () => {
    await set('old', entry('old'), createStore('vineward-outbox', 'records'));
    await set('pic', photoEntry('pic'), createStore('vineward-photos', 'photos'));
    const store = idbStore();
    expect(await store.records.get('old')).toEqual(entry('old'));
    expect((await store.photos.list()).map((p) => p.id)).toEqual(['pic']);
  });

  it('skips the empty value an update of a missing key used to write', async () => {
    const raw = createStore('holes-outbox', 'records');
    await set('a', entry('a'), raw);
    // What the previous outbox's patch did when the entry had gone meanwhile.
    await update('gone', () => undefined, raw);
    expect(await idbStore('holes').records.list()).toEqual([entry('a')]);
  });
});
