import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { getObjectBytes } from '../helpers/s3';

afterAll(closeTestDb);

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let other: { id: string };
let manager: Client;
const obs: Record<string, string> = {};
/** Photo ids, oldest first. */
const photos: string[] = [];

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

async function observe(client: Client, name: string, blockId: string, row: number, position: number, kind: string, data: object) {
  obs[name] = randomUUID();
  const res = await client.json('/api/sync', 'POST', {
    observations: [{ id: obs[name], blockId, row, position, kind, data, note: '', observedAt: '2026-03-01T08:00:00Z' }],
  });
  expect((await res.json()).results[0].status).toBe('created');
}

async function photo(client: Client, observationId: string, takenAt: string, confirm = true) {
  const id = randomUUID();
  const bytes = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 120, g: 90, b: 60 } } })
    .jpeg()
    .toBuffer();
  const presign = await (
    await client.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: bytes.length, takenAt })
  ).json();
  expect((await fetch(presign.uploadUrl, { method: 'PUT', headers: presign.headers, body: new Uint8Array(bytes) })).status).toBe(200);
  if (confirm) expect((await client.json('/api/photos/confirm', 'POST', { id })).status).toBe(200);
  return id;
}

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 5 });
  other = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 5 });
  const [scout, pruner] = [await as(team.scout.email), await as(team.pruner.email)];
  manager = await as(team.manager.email);
  await observe(scout, 'trunk', block.id, 1, 1, 'trunk-injury', { cause: 'mechanical', severity: 'severe', girdlingPercent: 70 });
  await observe(scout, 'budbreak', block.id, 2, 3, 'weak-budbreak', { budsRetained: 28, budsPushed: 20 });
  await observe(pruner, 'note', other.id, 1, 2, 'note', {});
  photos.push(await photo(scout, obs.trunk!, '2026-03-01T09:00:00Z'));
  photos.push(await photo(scout, obs.budbreak!, '2026-03-02T09:00:00Z'));
  photos.push(await photo(pruner, obs.note!, '2026-03-03T09:00:00Z'));
  photos.push(await photo(scout, obs.trunk!, '2026-03-04T09:00:00Z'));
  photos.push(await photo(scout, obs.budbreak!, '2026-03-05T09:00:00Z'));
  // Uploaded but never confirmed: not a photo anyone should see.
  await photo(scout, obs.trunk!, '2026-03-06T09:00:00Z', false);
});

const newestFirst = () => [...photos].reverse();

async function list(query = '') {
  const res = await manager.fetch(`/api/photos${query}`);
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()) as { photos: { id: string; [k: string]: unknown }[]; nextCursor: string | null };
}

describe('GET /api/photos (the photo log)', () => {
  it('lists stored photos newest first with their finding, vine and a link to it on the grid', async () => {
    const body = await list();
    expect(body.photos.map((p) => p.id)).toEqual(newestFirst());
    expect(body.nextCursor).toBeNull();
    expect(body.photos[1]).toMatchObject({
      id: photos[3],
      thumbUrl: `/api/photos/${photos[3]}?size=thumb`,
      fullUrl: `/api/photos/${photos[3]}?size=full`,
      takenAt: '2026-03-04T09:00:00.000000Z',
      row: 1,
      position: 1,
      block: { id: block.id },
      recordedByName: team.scout.name,
      observation: { id: obs.trunk, kind: 'trunk-injury', severity: 3, status: 'open' },
      gridUrl: `/grid/${block.id}?row=1&position=1`,
    });
  });

  it('pages with a cursor, every photo once', async () => {
    const seen: string[] = [];
    let cursor: string | null = null;
    const sizes: number[] = [];
    do {
      const page = await list(`?limit=2${cursor ? `&cursor=${cursor}` : ''}`);
      sizes.push(page.photos.length);
      seen.push(...page.photos.map((p) => p.id));
      cursor = page.nextCursor;
    } while (cursor);
    expect(sizes).toEqual([2, 2, 1]);
    expect(seen).toEqual(newestFirst());
  });

  it('filters by block, row, kind, least severity, person and date', async () => {
    const ids = async (q: string) => (await list(q)).photos.map((p) => p.id);
    expect(await ids(`?block=${other.id}`)).toEqual([photos[2]]);
    expect(await ids(`?block=${block.id}&row=2`)).toEqual([photos[4], photos[1]]);
    expect(await ids('?kind=trunk-injury')).toEqual([photos[3], photos[0]]);
    expect(await ids('?kind=trunk-injury,note')).toEqual([photos[3], photos[2], photos[0]]);
    expect(await ids('?severity=1')).toEqual([photos[4], photos[3], photos[1], photos[0]]);
    expect(await ids('?severity=3')).toEqual([photos[3], photos[0]]);
    expect(await ids(`?by=${team.pruner.id}`)).toEqual([photos[2]]);
    expect(await ids('?from=2026-03-02&to=2026-03-04')).toEqual([photos[3], photos[2], photos[1]]);
  });

  it('answers 422 naming the filter it cannot read', async () => {
    for (const [query, field] of [
      ['?row=2', 'row'],
      ['?severity=5', 'severity'],
      ['?kind=sunburn', 'kind'],
      ['?limit=500', 'limit'],
      ['?cursor=bm90LWEtY3Vyc29y', 'cursor'],
      ['?from=yesterday', 'from'],
    ] as const) {
      const res = await manager.fetch(`/api/photos${query}`);
      expect(res.status, query).toBe(422);
      expect(Object.keys((await res.json()).error.fields), query).toEqual([field]);
    }
  });

  it('shows another organisation none of these photos', async () => {
    const stranger = await as((await makeTeam()).advisor.email);
    const res = await stranger.fetch('/api/photos');
    expect(res.status).toBe(200);
    expect((await res.json()).photos).toEqual([]);
    expect((await new Client().fetch('/api/photos')).status).toBe(401);
  });
});

describe('GET /api/photos/:id', () => {
  it('redirects a member to a short-lived signed link: the thumbnail or the full photo', async () => {
    const row = await testDb()('photos').where({ id: photos[0] }).first();
    for (const [size, key] of [
      ['thumb', row.thumb_key],
      ['full', row.object_key],
    ] as const) {
      const res = await manager.fetch(`/api/photos/${photos[0]}?size=${size}`);
      expect(res.status, size).toBe(302);
      const location = new URL(res.headers.get('location')!);
      expect(location.pathname.endsWith(key)).toBe(true);
      expect(location.searchParams.get('X-Amz-Expires')).toBe('120');
      expect(location.searchParams.get('X-Amz-Signature')).toMatch(/^[0-9a-f]{64}$/);
      const image = Buffer.from(await (await fetch(location)).arrayBuffer());
      expect(image.equals((await getObjectBytes(key))!), size).toBe(true);
    }
    const thumb = await sharp(
      Buffer.from(await (await fetch((await manager.fetch(`/api/photos/${photos[0]}?size=thumb`)).headers.get('location')!)).arrayBuffer()),
    ).metadata();
    expect([thumb.width, thumb.height]).toEqual([320, 240]);
  });

  it('refuses strangers: another organisation gets 404 even with the id, a signed-out caller 401', async () => {
    const stranger = await as((await makeTeam()).manager.email);
    for (const size of ['thumb', 'full']) {
      const res = await stranger.fetch(`/api/photos/${photos[0]}?size=${size}`);
      expect(res.status).toBe(404);
      expect(res.headers.get('location')).toBeNull();
    }
    expect((await new Client().fetch(`/api/photos/${photos[0]}?size=thumb`)).status).toBe(401);
  });

  it('answers 404 for a photo still pending, 422 for an id that is not one or an unknown size', async () => {
    const pending = await testDb()('photos').where({ observation_id: obs.trunk, status: 'pending' }).first();
    expect((await manager.fetch(`/api/photos/${pending.id}`)).status).toBe(404);
    expect((await manager.fetch('/api/photos/latest')).status).toBe(422);
    const res = await manager.fetch(`/api/photos/${photos[0]}?size=huge`);
    expect(res.status).toBe(422);
    expect(Object.keys((await res.json()).error.fields)).toEqual(['size']);
  });
});
