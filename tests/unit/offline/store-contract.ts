/** What every outbox store must do, whatever keeps the entries (run by store.test.ts for each). */
import { describe, expect, it } from 'vitest';
import type { RecordEntry, OutboxStore, PhotoEntry } from '@/lib/offline/store';

export const entry = (id: string, patch: Partial<RecordEntry> = {}): RecordEntry => ({
  id,
  owner: 'scout-a',
  collection: 'observations',
  record: { id, blockId: 'b1', row: 3, position: 7, kind: 'budbreak', data: { budsRetained: 20, budsPushed: 9 } },
  state: 'queued',
  attempts: 0,
  createdAt: 1000,
  ...patch,
});

export const photoEntry = (id: string, patch: Partial<PhotoEntry> = {}): PhotoEntry => ({
  id,
  owner: 'scout-a',
  observationId: 'o1',
  blob: new Blob([new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3])], { type: 'image/jpeg' }),
  contentType: 'image/jpeg',
  bytes: 7,
  takenAt: '2026-02-10T08:00:00.000Z',
  state: 'queued',
  attempts: 0,
  createdAt: 1000,
  ...patch,
});

export function storeContract(name: string, open: () => OutboxStore) {
  describe(`outbox store contract: ${name}`, () => {
    it('starts empty', async () => {
      const { records, photos } = open();
      expect(await records.list()).toEqual([]);
      expect(await photos.list()).toEqual([]);
      expect(await records.get('nope')).toBeUndefined();
    });

    it('gives back what was put, by id and in the list; a second put under the id replaces it', async () => {
      const { records } = open();
      await records.put(entry('a'));
      await records.put(entry('b', { owner: 'scout-b' }));
      expect(await records.get('a')).toEqual(entry('a'));
      await records.put(entry('a', { attempts: 3 }));
      expect((await records.list()).sort((x, y) => x.id.localeCompare(y.id))).toEqual([entry('a', { attempts: 3 }), entry('b', { owner: 'scout-b' })]);
    });

    it('updates in place, and an update of a missing id creates nothing', async () => {
      const { records } = open();
      await records.put(entry('a'));
      await records.update('a', (e) => ({ ...e, state: 'rejected', errors: [{ field: 'data', message: 'no' }] }));
      expect(await records.get('a')).toEqual(entry('a', { state: 'rejected', errors: [{ field: 'data', message: 'no' }] }));
      await records.update('gone', (e) => ({ ...e, state: 'queued' }));
      expect(await records.get('gone')).toBeUndefined();
      expect(await records.list()).toHaveLength(1);
    });

    it('updates of one entry made at once all count', async () => {
      const { records } = open();
      await records.put(entry('a'));
      await Promise.all(Array.from({ length: 5 }, () => records.update('a', (e) => ({ ...e, attempts: e.attempts + 1 }))));
      expect((await records.get('a'))!.attempts).toBe(5);
    });

    it('deletes, and deleting a missing id is no error', async () => {
      const { records } = open();
      await records.put(entry('a'));
      await records.delete('a');
      await records.delete('a');
      expect(await records.get('a')).toBeUndefined();
      expect(await records.list()).toEqual([]);
    });

    it('hands out copies: changing a value read or put changes nothing stored', async () => {
      const { records } = open();
      const put = entry('a');
      await records.put(put);
      put.state = 'rejected';
      const read = (await records.get('a'))!;
      read.record.row = 99;
      (await records.list())[0]!.attempts = 7;
      expect(await records.get('a')).toEqual(entry('a'));
    });

    it('keeps records and photos apart, even under one id', async () => {
      const { records, photos } = open();
      await records.put(entry('same'));
      await photos.put(photoEntry('same'));
      await records.delete('same');
      expect(await photos.get('same')).toMatchObject({ id: 'same', observationId: 'o1' });
    });

    it('keeps a photo’s bytes and type', async () => {
      const { photos } = open();
      await photos.put(photoEntry('p'));
      const back = (await photos.get('p'))!;
      expect(back.blob.type).toBe('image/jpeg');
      expect([...new Uint8Array(await back.blob.arrayBuffer())]).toEqual([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3]);
    });

    it('lists a long day’s work whole', async () => {
      const { records } = open();
      for (let i = 0; i < 600; i++) await records.put(entry(`r${i}`, { createdAt: i }));
      const all = await records.list();
      expect(all).toHaveLength(600);
      expect(new Set(all.map((e) => e.id)).size).toBe(600);
    });
  });
}
