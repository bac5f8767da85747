/**
 * Object storage slow or gone, and photo integrity. Each case checks in PostgreSQL and in the S3
 * fake that nothing was lost and nothing doubled. The S3 fake is stalled with SIGSTOP (it accepts
 * connections and never answers) or stopped (connections refused); afterAll always brings it back.
 */
import { createHash, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sweepPendingPhotos } from '@/lib/server/services/photos';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { resumeStorage, stallStorage, startStorage, stopStorage, timed } from '../helpers/faults';
import { Client } from '../helpers/http';
import { pixelBombPng, smallJpeg } from '../helpers/images';
import { getObjectBytes, objectExists } from '../helpers/s3';

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let scout: Client;
let observationId: string;

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const observation = (note: string, id = randomUUID()) => ({
  id,
  blockId: block.id,
  row: 1,
  position: 2,
  kind: 'note',
  data: {},
  note,
  observedAt: new Date().toISOString(),
});

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 4, vinesPerRow: 10 });
  scout = new Client();
  await scout.signIn(team.scout.email, PASSWORD);
  const obs = observation('photos under faults');
  observationId = obs.id;
  expect((await (await scout.json('/api/sync', 'POST', { observations: [obs] })).json()).results[0].status).toBe('created');
});

afterAll(async () => {
  // Whatever failed above, later test files need a working store.
  try {
    resumeStorage();
    await startStorage();
  } finally {
    await closeTestDb();
  }
});

async function presign(bytes: Buffer, contentType = 'image/jpeg', id = randomUUID()) {
  const res = await scout.json('/api/photos/presign', 'POST', { id, observationId, contentType, bytes: bytes.length });
  return { id, res, body: await res.json() };
}

async function upload(bytes: Buffer, contentType = 'image/jpeg') {
  const p = await presign(bytes, contentType);
  expect(p.res.status).toBe(200);
  const put = await fetch(p.body.uploadUrl, { method: 'PUT', headers: p.body.headers, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  return { id: p.id, uploadUrl: p.body.uploadUrl as string, headers: p.body.headers as Record<string, string> };
}

const confirm = (id: string, signal?: AbortSignal) =>
  scout.fetch('/api/photos/confirm', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ id }), signal });

/** Exactly one stored row per id, its bytes in storage matching the recorded checksum, no upload left. */
async function expectStoredOnce(ids: string[]) {
  const rows = await testDb()('photos').whereIn('id', ids);
  expect(rows).toHaveLength(ids.length);
  for (const row of rows) {
    expect(row.status).toBe('stored');
    expect(row.upload_key).not.toBe(row.object_key);
    const stored = (await getObjectBytes(row.object_key))!;
    expect(sha256(stored)).toBe(row.sha256);
    expect(stored.length).toBe(Number(row.bytes));
    expect(await objectExists(row.thumb_key)).toBe(true);
    expect(await objectExists(row.upload_key)).toBe(false);
  }
}

/** The grid and a sync, timed, while something else is going on. */
async function gridAndSync() {
  const grid = await timed((signal) => scout.fetch(`/api/grid/${block.id}`, { signal }), 10_000);
  const obs = observation('written while storage is down');
  const sync = await timed(
    (signal) =>
      scout.fetch('/api/sync', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ observations: [obs] }), signal }),
    10_000,
  );
  return { grid, sync, obs };
}

describe('object storage stalled (accepts connections, never answers)', () => {
  it('answers each photo confirm 503 with Retry-After within seconds, keeps the grid and sync answering, and stores every photo once when it returns', async () => {
    // Finding 1: 14 stalled confirms used to hold every pooled connection; 16 here.
    const photos = await Promise.all(Array.from({ length: 16 }, (_, i) => smallJpeg(20 + i * 9).then(upload)));
    const ids = photos.map((p) => p.id);
    stallStorage();
    let confirms: Awaited<ReturnType<typeof timed>>[];
    let during: Awaited<ReturnType<typeof gridAndSync>>;
    try {
      const pending = Promise.all(ids.map((id) => timed((signal) => confirm(id, signal), 20_000)));
      await new Promise((r) => setTimeout(r, 1000)); // every confirm is now waiting on the store
      during = await gridAndSync();
      confirms = await pending;
    } finally {
      resumeStorage();
    }
    expect(during.grid.status).toBe(200);
    expect(during.grid.ms).toBeLessThan(5000);
    expect(during.sync.status).toBe(200);
    expect(during.sync.ms).toBeLessThan(5000);
    expect(during.sync.json().results[0].status).toBe('created');
    for (const c of confirms) {
      expect(c.status, c.text).toBe(503);
      expect(c.ms).toBeLessThan(10_000);
      expect(Number(c.headers.get('retry-after'))).toBeGreaterThan(0);
      expect(c.json().error.code).toBe('unavailable');
    }
    // Nothing was lost while the store hung: every row is still pending, with its upload.
    const rows = await testDb()('photos').whereIn('id', ids);
    expect(rows.map((r) => r.status)).toEqual(ids.map(() => 'pending'));

    // The device sends each again once the store answers: stored once each.
    for (const id of ids) expect((await confirm(id)).status).toBe(200);
    await expectStoredOnce(ids);
    expect(await testDb()('observations').where({ id: during.obs.id })).toHaveLength(1);
  });
});

describe('object storage stopped (connections refused)', () => {
  it('answers confirm 503 fast, reports storage down on /api/health, and confirms the photo once when the store is back', async () => {
    const { id } = await upload(await smallJpeg(201));
    stopStorage();
    let down: Awaited<ReturnType<typeof timed>>;
    let health: Awaited<ReturnType<typeof timed>>;
    let during: Awaited<ReturnType<typeof gridAndSync>>;
    try {
      down = await timed((signal) => confirm(id, signal));
      health = await timed((signal) => scout.fetch('/api/health', { signal }));
      during = await gridAndSync();
    } finally {
      await startStorage();
    }
    expect(down.status, down.text).toBe(503);
    expect(down.ms).toBeLessThan(5000);
    expect(down.headers.get('retry-after')).toBeTruthy();
    // The database still serves, so the server stays in rotation; the body names what is down.
    expect(health.status).toBe(200);
    expect(health.json()).toEqual({ ok: false, database: true, storage: false, mail: true });
    expect([during.grid.status, during.sync.status]).toEqual([200, 200]);

    expect((await testDb()('photos').where({ id }).first()).status).toBe('pending');
    expect((await confirm(id)).status).toBe(200);
    await expectStoredOnce([id]);
  });
});

describe('photo integrity', () => {
  it('uploads to a key that is never served, so a later PUT to the upload link cannot replace the stored photo', async () => {
    const original = await smallJpeg(77);
    const { id, uploadUrl, headers } = await upload(original);
    const facts = await (await confirm(id)).json();
    const row = await testDb()('photos').where({ id }).first();
    expect(new URL(uploadUrl).pathname).not.toContain(row.object_key);

    // Finding 4: other bytes of the same length, PUT to the still-valid link.
    const other = Buffer.alloc(original.length);
    (await smallJpeg(250, 300, 200)).copy(other);
    await fetch(uploadUrl, { method: 'PUT', headers, body: new Uint8Array(other) });

    const link = await scout.fetch(`/api/photos/${id}?size=full`);
    expect(link.status).toBe(302);
    const served = Buffer.from(await (await fetch(link.headers.get('location')!)).arrayBuffer());
    expect(sha256(served)).toBe(facts.sha256);
    expect(sha256(served)).toBe(row.sha256);
    expect(served.length).toBe(Number(row.bytes));
  });

  it('binds the upload link to the declared size and type: other lengths and types are refused by the store', async () => {
    const bytes = await smallJpeg(90);
    const p = await presign(bytes);
    const longer = await fetch(p.body.uploadUrl, { method: 'PUT', headers: p.body.headers, body: new Uint8Array(Buffer.concat([bytes, Buffer.alloc(1000)])) });
    expect(longer.status).toBe(403);
    const png = await fetch(p.body.uploadUrl, { method: 'PUT', headers: { 'content-type': 'image/png' }, body: new Uint8Array(bytes) });
    expect(png.status).toBe(403);
    expect(await objectExists((await testDb()('photos').where({ id: p.id }).first()).upload_key)).toBe(false);
    const link = new URL(p.body.uploadUrl);
    expect(Number(link.searchParams.get('X-Amz-Expires'))).toBeLessThanOrEqual(300);
  });

  it('lets only one of two simultaneous confirms of a photo do the work, and stores it once', async () => {
    const { id } = await upload(await smallJpeg(133));
    const [a, b] = await Promise.all([confirm(id), confirm(id)]);
    const statuses = [a.status, b.status].sort();
    // The second either waited its turn and saw it stored, or was told to try again shortly.
    expect(statuses[0]).toBe(200);
    expect([200, 503]).toContain(statuses[1]);
    expect((await confirm(id)).status).toBe(200);
    await expectStoredOnce([id]);
  });
});

describe('hostile photo inputs', () => {
  it('refuses a 16,000 × 16,000 PNG by its pixel count with a 422 that says why, and deletes the upload', async () => {
    const bomb = await pixelBombPng();
    expect(bomb.length).toBeLessThan(1024 * 1024);
    const { id } = await upload(bomb, 'image/png');
    const uploadKey = (await testDb()('photos').where({ id }).first()).upload_key;
    const res = await timed((signal) => confirm(id, signal));
    expect(res.status, res.text).toBe(422);
    expect(res.json().error.message).toMatch(/256 megapixels.*at most 40/);
    expect(await testDb()('photos').where({ id })).toHaveLength(0);
    expect(await objectExists(uploadKey)).toBe(false);
    expect(await objectExists(`orgs/${team.org.id}/photos/${id}.jpg`)).toBe(false);
  });

  it('refuses a renamed non-image, a wrong type, a false size, a malformed body and a non-UUID id, each with its 4xx JSON', async () => {
    const text = Buffer.from('GIF89a but really a shopping list\n'.repeat(40));
    const { id } = await upload(text);
    const notPhoto = await confirm(id);
    expect(notPhoto.status).toBe(422);
    expect((await notPhoto.json()).error.message).toMatch(/not a photo/);
    expect(await testDb()('photos').where({ id })).toHaveLength(0);

    const gif = await scout.json('/api/photos/presign', 'POST', { id: randomUUID(), observationId, contentType: 'image/gif', bytes: 1000 });
    expect(gif.status).toBe(422);
    expect((await gif.json()).error.fields.contentType).toBeTruthy();
    const huge = await scout.json('/api/photos/presign', 'POST', { id: randomUUID(), observationId, contentType: 'image/jpeg', bytes: 50 * 1024 * 1024 });
    expect(huge.status).toBe(422);
    const wrongType = await scout.json('/api/photos/presign', 'POST', { id: randomUUID(), observationId, contentType: 'image/jpeg', bytes: '1000' });
    expect(wrongType.status).toBe(422);
    const malformed = await scout.fetch('/api/photos/confirm', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{"id":' });
    expect(malformed.status).toBe(400);
    expect((await malformed.json()).error.code).toBe('bad-request');
    const notUuid = await scout.json('/api/photos/confirm', 'POST', { id: 'not-an-id' });
    expect(notUuid.status).toBe(422);
    const unknown = await scout.json('/api/photos/confirm', 'POST', { id: randomUUID() });
    expect(unknown.status).toBe(404);
  });
});

describe('the sweep, with upload keys', () => {
  it('removes a week-old pending photo with its upload, and uploads no pending photo waits on, but keeps live ones', async () => {
    const live = await upload(await smallJpeg(31));
    const stale = await upload(await smallJpeg(32));
    await testDb()('photos')
      .where({ id: stale.id })
      .update({ created_at: new Date(Date.now() - 8 * 24 * 3600 * 1000) });
    const staleKey = (await testDb()('photos').where({ id: stale.id }).first()).upload_key;
    // A PUT after its photo was confirmed leaves an upload nobody waits on.
    const done = await upload(await smallJpeg(33));
    expect((await confirm(done.id)).status).toBe(200);
    const doneKey = (await testDb()('photos').where({ id: done.id }).first()).upload_key;
    await fetch(done.uploadUrl, { method: 'PUT', headers: done.headers, body: new Uint8Array(await smallJpeg(33)) });
    expect(await objectExists(doneKey)).toBe(true);

    // Orphans are removed an hour after they were written; here, anything written up to now.
    expect(await sweepPendingPhotos(undefined, new Date(Date.now() + 1000))).toBeGreaterThanOrEqual(1);
    expect(await testDb()('photos').where({ id: stale.id })).toHaveLength(0);
    expect(await objectExists(staleKey)).toBe(false);
    expect(await objectExists(doneKey)).toBe(false);
    const liveRow = await testDb()('photos').where({ id: live.id }).first();
    expect(liveRow.status).toBe('pending');
    expect(await objectExists(liveRow.upload_key)).toBe(true);
    expect((await confirm(live.id)).status).toBe(200);
    await expectStoredOnce([live.id, done.id]);
  });
});
