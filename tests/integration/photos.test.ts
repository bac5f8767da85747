import { randomUUID } from 'node:crypto';
import { PutObjectCommand } from '@aws-sdk/client-s3';
import exifr from 'exifr';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { getObjectBytes, objectExists, testS3 } from '../helpers/s3';

afterAll(closeTestDb);

let team: Awaited<ReturnType<typeof makeTeam>>;
let scout: Client;
let observationId: string;

beforeAll(async () => {
  team = await makeTeam();
  const block = await makeBlock(team.org.id);
  scout = new Client();
  await scout.signIn(team.scout.email, PASSWORD);
  observationId = randomUUID();
  const res = await scout.json('/api/sync', 'POST', {
    observations: [
      {
        id: observationId,
        blockId: block.id,
        row: 1,
        position: 1,
        kind: 'trunk-injury',
        data: { cause: 'mechanical', severity: 'moderate', girdlingPercent: 30 },
        note: '',
        observedAt: new Date().toISOString(),
      },
    ],
  });
  expect((await res.json()).results[0].status).toBe('created');
});

/** A 600×400 JPEG lying on its side (EXIF orientation 6), with camera and GPS tags. */
function sidewaysPhoto() {
  return sharp({ create: { width: 600, height: 400, channels: 3, background: { r: 90, g: 120, b: 60 } } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .withExifMerge({
      IFD0: { Make: 'TestCam', Model: 'Field 1' },
      IFD3: { GPSLatitudeRef: 'S', GPSLatitude: '41/1 17/1 0/1', GPSLongitudeRef: 'E', GPSLongitude: '174/1 46/1 0/1' },
    })
    .toBuffer();
}

async function upload(client: Client, bytes: Buffer, contentType = 'image/jpeg', id = randomUUID()) {
  const presign = await client.json('/api/photos/presign', 'POST', { id, observationId, contentType, bytes: bytes.length });
  const body = await presign.json();
  if (presign.status !== 200) return { id, presign, body };
  const put = await fetch(body.uploadUrl, { method: 'PUT', headers: body.headers, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  return { id, presign, body };
}

describe('photo upload: presign, PUT to storage, confirm', () => {
  it('stores an upright copy without camera or location metadata, with a thumbnail and its facts', async () => {
    const original = await sidewaysPhoto();
    expect((await exifr.gps(original))?.latitude).toBeCloseTo(-41.283, 2);
    expect((await sharp(original).metadata()).orientation).toBe(6);
    const { id } = await upload(scout, original);
    const res = await scout.json('/api/photos/confirm', 'POST', { id });
    expect(res.status).toBe(200);
    const facts = await res.json();
    expect(facts).toMatchObject({ id, status: 'stored', width: 400, height: 600 });

    const row = await testDb()('photos').where({ id }).first();
    const stored = (await getObjectBytes(row.object_key))!;
    const meta = await sharp(stored).metadata();
    expect([meta.width, meta.height, meta.orientation ?? 1]).toEqual([400, 600, 1]);
    expect(meta.exif).toBeUndefined();
    expect(await exifr.gps(stored).catch(() => undefined)).toBeUndefined();
    expect(row).toMatchObject({ status: 'stored', bytes: String(stored.length), width: 400, height: 600, latitude: null });
    expect(row.sha256).toMatch(/^[0-9a-f]{64}$/);

    const thumb = (await getObjectBytes(row.thumb_key))!;
    const thumbMeta = await sharp(thumb).metadata();
    expect(Math.max(thumbMeta.width!, thumbMeta.height!)).toBe(320);
  });

  it('keeps the location in the database, never in the file, when the organisation chose to', async () => {
    await testDb()('organisations').where({ id: team.org.id }).update({ keep_photo_location: true });
    try {
      const { id } = await upload(scout, await sidewaysPhoto());
      expect((await scout.json('/api/photos/confirm', 'POST', { id })).status).toBe(200);
      const row = await testDb()('photos').where({ id }).first();
      expect(row.latitude).toBeCloseTo(-41.2833, 3);
      expect(row.longitude).toBeCloseTo(174.7667, 3);
      expect((await sharp((await getObjectBytes(row.object_key))!).metadata()).exif).toBeUndefined();
    } finally {
      await testDb()('organisations').where({ id: team.org.id }).update({ keep_photo_location: false });
    }
  });

  it('is idempotent at every step: a second presign says stored, a second confirm answers the same facts', async () => {
    const { id } = await upload(scout, await sidewaysPhoto());
    const first = await (await scout.json('/api/photos/confirm', 'POST', { id })).json();
    const second = await (await scout.json('/api/photos/confirm', 'POST', { id })).json();
    expect(second).toEqual(first);
    const again = await scout.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: 1000 });
    expect(await again.json()).toEqual({ id, status: 'stored' });
    expect(await testDb()('photos').where({ id }).count()).toEqual([{ count: '1' }]);
  });

  it('refuses a text file renamed .jpg and deletes it from storage', async () => {
    const text = Buffer.from('this is not a photo of a vine\n'.repeat(50));
    const { id } = await upload(scout, text);
    // The device's bytes wait at the upload key until confirm.
    const key = (await testDb()('photos').where({ id }).first()).upload_key;
    expect(await objectExists(key)).toBe(true);
    const res = await scout.json('/api/photos/confirm', 'POST', { id });
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toMatch(/not a photo/);
    expect(await objectExists(key)).toBe(false);
    expect(await testDb()('photos').where({ id })).toHaveLength(0);
  });

  it('refuses a photo over the size limit, claimed or actually uploaded, and deletes what arrived', async () => {
    const claimed = await scout.json('/api/photos/presign', 'POST', { id: randomUUID(), observationId, contentType: 'image/jpeg', bytes: 9 * 1024 * 1024 });
    expect(claimed.status).toBe(422);
    expect((await claimed.json()).error.fields.bytes[0]).toMatch(/limited to 8 MB/);

    // A device that lies about the size is refused by the store: the link signs the length.
    const id = randomUUID();
    const presign = await (await scout.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: 1000 })).json();
    const put = await fetch(presign.uploadUrl, { method: 'PUT', headers: presign.headers, body: new Uint8Array(9 * 1024 * 1024) });
    expect(put.status).toBe(403);
    expect((await scout.json('/api/photos/confirm', 'POST', { id })).status).toBe(409);

    // Should an oversized object reach the upload key anyway, the server catches it by its length.
    const key = (await testDb()('photos').where({ id }).first()).upload_key;
    await testS3().send(new PutObjectCommand({ Bucket: process.env.S3_BUCKET!, Key: key, Body: new Uint8Array(9 * 1024 * 1024) }));
    const res = await scout.json('/api/photos/confirm', 'POST', { id });
    expect(res.status).toBe(413);
    expect(await objectExists(key)).toBe(false);
    expect(await objectExists(`orgs/${team.org.id}/photos/${id}.jpg`)).toBe(false);
    expect(await testDb()('photos').where({ id })).toHaveLength(0);
  });

  it('answers 409 when confirming before the upload arrived, and keeps the pending row for a retry', async () => {
    const id = randomUUID();
    await scout.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: 1000 });
    const res = await scout.json('/api/photos/confirm', 'POST', { id });
    expect(res.status).toBe(409);
    expect((await testDb()('photos').where({ id }).first()).status).toBe('pending');
  });

  it('refuses signed-out callers, advisors, and photos or observations of another organisation', async () => {
    const body = { id: randomUUID(), observationId, contentType: 'image/jpeg', bytes: 1000 };
    expect((await new Client().json('/api/photos/presign', 'POST', body)).status).toBe(401);
    const advisor = new Client();
    await advisor.signIn(team.advisor.email, PASSWORD);
    expect((await advisor.json('/api/photos/presign', 'POST', body)).status).toBe(403);

    const other = await makeTeam();
    const stranger = new Client();
    await stranger.signIn(other.scout.email, PASSWORD);
    expect((await stranger.json('/api/photos/presign', 'POST', body)).status).toBe(404);
    const { id } = await upload(scout, await sidewaysPhoto());
    expect((await stranger.json('/api/photos/confirm', 'POST', { id })).status).toBe(404);
  });
});
