import 'fake-indexeddb/auto';
import { describe, expect, it, vi } from 'vitest';
import { idbStore } from '@/lib/offline/idb-store';
import { memoryStore } from '@/lib/offline/memory-store';
import { collectionOf, createOutbox } from '@/lib/offline/queue';
import type { OutboxStore } from '@/lib/offline/store';
import { jpeg, record, uuid } from './fakes';

let n = 0;

describe.each([
  ['in memory', memoryStore],
  ['in IndexedDB', () => idbStore(`outbox-${n++}`)],
] as [string, () => OutboxStore][])('the outbox %s', (_, open) => {
  function outbox() {
    let now = 5000;
    let next = 900;
    const tick = () => now++;
    return createOutbox(open(), { now: tick, newId: () => uuid(next++) });
  }
  const photo = (id: number, observationId: number) => ({
    id: uuid(id),
    owner: 'scout-a',
    observationId: uuid(observationId),
    blob: jpeg(64),
    contentType: 'image/jpeg',
    bytes: 64,
    takenAt: '2026-02-10T08:00:00Z',
  });

  it('queues a record for its owner and collection, with no attempts yet', async () => {
    const o = outbox();
    await o.enqueueRecord('scout-a', 'flags', { ...record(1), reason: 'replant' });
    await o.enqueueObservation('scout-b', record(2));
    expect(await o.listObservations()).toEqual([
      { id: uuid(1), owner: 'scout-a', collection: 'flags', record: { ...record(1), reason: 'replant' }, state: 'queued', attempts: 0, createdAt: 5000 },
      { id: uuid(2), owner: 'scout-b', collection: 'observations', record: record(2), state: 'queued', attempts: 0, createdAt: 5001 },
    ]);
  });

  it('lists oldest first, and by id within one millisecond', async () => {
    const store = open();
    const o = createOutbox(store, { now: () => 7 });
    await o.enqueueObservation('scout-a', record(3));
    await o.enqueueObservation('scout-a', record(1));
    const later = createOutbox(store, { now: () => 6 });
    await later.enqueueObservation('scout-a', record(2));
    expect((await o.listObservations()).map((e) => e.record.position)).toEqual([2, 1, 3]);
  });

  it('reads entries saved before collections existed as observations', () => {
    expect(collectionOf({ id: 'x', owner: 'a', record: record(1), state: 'queued', attempts: 0, createdAt: 0 })).toBe('observations');
  });

  it('patches entries, and a patch of an entry that has gone brings nothing back', async () => {
    const o = outbox();
    await o.enqueueObservation('scout-a', record(1));
    await o.enqueuePhoto(photo(50, 1));
    await o.patchObservations([uuid(1), uuid(2)], { state: 'sending' });
    await o.patchPhoto(uuid(50), { state: 'uploaded' });
    await o.patchPhoto(uuid(51), { state: 'uploaded' });
    expect((await o.listObservations()).map((e) => [e.id, e.state])).toEqual([[uuid(1), 'sending']]);
    expect((await o.listPhotos()).map((p) => [p.id, p.state])).toEqual([[uuid(50), 'uploaded']]);
    expect(await o.getObservationEntry(uuid(2))).toBeUndefined();
  });

  it('a corrected record goes back in the queue under its id, without its old errors', async () => {
    const o = outbox();
    await o.enqueueObservation('scout-a', record(1, { budsRetained: -1 }));
    await o.patchObservations([uuid(1)], { state: 'rejected', errors: [{ field: 'data.budsRetained', message: 'Must be 0 or more.' }] });
    await o.replaceObservation(record(1, { budsRetained: 20 }));
    const [e] = await o.listObservations();
    expect(e).toMatchObject({ id: uuid(1), state: 'queued', record: record(1, { budsRetained: 20 }) });
    expect(e!.errors).toBeUndefined();
    await o.replaceObservation(record(2));
    expect(await o.listObservations()).toHaveLength(1);
  });

  it('a conflicting record is kept under a new id, and its photos follow it', async () => {
    const o = outbox();
    await o.enqueueObservation('scout-a', record(1));
    await o.enqueuePhoto(photo(50, 1));
    await o.enqueuePhoto(photo(51, 2));
    await o.patchObservations([uuid(1)], { state: 'rejected', conflict: true, errors: [{ field: 'id', message: 'taken' }] });
    await o.reissueObservation(uuid(1));
    const [e] = await o.listObservations();
    expect(e).toMatchObject({ id: uuid(900), record: { ...record(1), id: uuid(900) }, state: 'queued', owner: 'scout-a' });
    expect(e!.conflict).toBeUndefined();
    expect((await o.listPhotos()).map((p) => [p.id, p.observationId])).toEqual([
      [uuid(50), uuid(900)],
      [uuid(51), uuid(2)],
    ]);
    await o.reissueObservation(uuid(1));
    expect(await o.listObservations()).toHaveLength(1);
  });

  it('after a crash nothing stays in flight; what was uploaded or rejected stays so', async () => {
    const o = outbox();
    for (let i = 1; i <= 3; i++) await o.enqueueObservation('scout-a', record(i));
    for (let i = 1; i <= 3; i++) await o.enqueuePhoto(photo(50 + i, i));
    await o.patchObservations([uuid(1)], { state: 'sending' });
    await o.patchObservations([uuid(2)], { state: 'rejected' });
    await o.patchPhoto(uuid(51), { state: 'uploading' });
    await o.patchPhoto(uuid(52), { state: 'uploaded' });
    await o.patchPhoto(uuid(53), { state: 'rejected' });
    await o.recoverInterrupted();
    expect((await o.listObservations()).map((e) => e.state)).toEqual(['queued', 'rejected', 'queued']);
    expect((await o.listPhotos()).map((p) => p.state)).toEqual(['queued', 'uploaded', 'rejected']);
  });

  it('removes only what it is told to', async () => {
    const o = outbox();
    await o.enqueueObservation('scout-a', record(1));
    await o.enqueueObservation('scout-a', record(2));
    await o.enqueuePhoto(photo(50, 1));
    await o.removeObservation(uuid(1));
    await o.removePhoto(uuid(50));
    expect((await o.listObservations()).map((e) => e.id)).toEqual([uuid(2)]);
    expect(await o.listPhotos()).toEqual([]);
  });
});

describe('outbox change notices', () => {
  it('reach this tab’s listeners and the other tabs on every change, and stop on unsubscribe', async () => {
    const heard: (() => void)[] = [];
    const channel = { post: vi.fn(), listen: vi.fn((fn: () => void) => (heard.push(fn), () => void heard.splice(heard.indexOf(fn), 1))) };
    const o = createOutbox(memoryStore(), { channel });
    const listener = vi.fn();
    const unsubscribe = o.onChange(listener);
    await o.enqueueObservation('scout-a', record(1));
    await o.patchObservations([uuid(1)], { state: 'rejected' });
    await o.removeObservation(uuid(1));
    expect(listener).toHaveBeenCalledTimes(3);
    expect(channel.post).toHaveBeenCalledTimes(3);
    heard[0]!(); // another tab changed the outbox
    expect(listener).toHaveBeenCalledTimes(4);
    unsubscribe();
    await o.enqueueObservation('scout-a', record(2));
    expect(listener).toHaveBeenCalledTimes(4);
    expect(heard).toHaveLength(0);
  });
});
