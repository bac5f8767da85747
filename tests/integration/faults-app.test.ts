/**
 * An app server killed (SIGKILL) in the middle of a sync batch and of a photo confirm. The suite's
 * own server keeps running; this file starts a second one of its own on the slot's spare port,
 * against the same PostgreSQL and S3 fake. The device then retries against the suite's server:
 * every record and the photo end up stored exactly once.
 */
import { createHash, randomUUID } from 'node:crypto';
import type { ChildProcess } from 'node:child_process';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { startSpareApp } from '../helpers/faults';
import { Client } from '../helpers/http';
import { getObjectBytes, objectExists } from '../helpers/s3';

let team: Awaited<ReturnType<typeof makeTeam>>;
let block: { id: string };
let spare: { child: ChildProcess; url: string } | undefined;
let onSpare: Client;
let onMain: Client;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 10, vinesPerRow: 20 });
  onMain = new Client();
  await onMain.signIn(team.scout.email, PASSWORD);
});

afterAll(async () => {
  spare?.child.kill('SIGKILL');
  await closeTestDb();
});

async function freshSpare() {
  spare?.child.kill('SIGKILL');
  spare = await startSpareApp();
  onSpare = new Client(spare.url);
  await onSpare.signIn(team.scout.email, PASSWORD);
  return spare;
}

/** Sends on the spare server and kills it `afterMs` later: the device never gets this answer. */
async function killedMidRequest(send: () => Promise<Response>, afterMs: number) {
  const server = spare!;
  const answer = send().then(
    (r) => r.status,
    () => 0,
  );
  await new Promise((r) => setTimeout(r, afterMs));
  server.child.kill('SIGKILL');
  return answer;
}

describe('an app server killed mid-batch', () => {
  it('loses nothing and doubles nothing: the retried sync batch is stored once', async () => {
    await freshSpare();
    const observations = Array.from({ length: 200 }, (_, i) => ({
      id: randomUUID(),
      blockId: block.id,
      row: 1 + (i % 10),
      position: 1 + (i % 20),
      kind: 'note',
      data: {},
      note: `killed ${i}`,
      observedAt: new Date(Date.now() - i * 1000).toISOString(),
    }));
    const status = await killedMidRequest(() => onSpare.json('/api/sync', 'POST', { observations }), 40);
    expect([0, 200]).toContain(status);

    // The device did not see an answer it can trust, so it sends the same batch again.
    const retry = await onMain.json('/api/sync', 'POST', { observations });
    expect(retry.status).toBe(200);
    const { results } = await retry.json();
    expect(results).toHaveLength(200);
    for (const r of results) expect(['created', 'duplicate']).toContain(r.status);
    const stored = await testDb()('observations')
      .whereIn(
        'id',
        observations.map((o) => o.id),
      )
      .count<{ count: string }[]>();
    expect(Number(stored[0]!.count)).toBe(200);
  });

  it('keeps a photo whose confirm died with its server, and stores it once when the device confirms again', async () => {
    await freshSpare();
    const observationId = randomUUID();
    await onMain.json('/api/sync', 'POST', {
      observations: [
        { id: observationId, blockId: block.id, row: 2, position: 2, kind: 'note', data: {}, note: 'killed confirm', observedAt: new Date().toISOString() },
      ],
    });
    // Large enough that the confirm is still working when the server dies.
    const noise = await sharp({ create: { width: 1500, height: 1000, channels: 3, background: '#6e6450', noise: { type: 'gaussian', mean: 110, sigma: 40 } } })
      .png()
      .toBuffer();
    const photo = await sharp(noise).resize(4000, 3000).jpeg({ quality: 90 }).toBuffer();
    const id = randomUUID();
    const presign = await (await onMain.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: photo.length })).json();
    expect((await fetch(presign.uploadUrl, { method: 'PUT', headers: presign.headers, body: new Uint8Array(photo) })).status).toBe(200);

    const status = await killedMidRequest(() => onSpare.json('/api/photos/confirm', 'POST', { id }), 150);
    expect([0, 200]).toContain(status);

    let again = await onMain.json('/api/photos/confirm', 'POST', { id });
    if (again.status === 503) {
      // The dead server's claim still runs: the device is told to come back later.
      expect(again.headers.get('retry-after')).toBeTruthy();
      expect((await testDb()('photos').where({ id }).first()).status).toBe('pending');
      // Later, after its lease ran out (moved forward here rather than waited for):
      await testDb()('photos')
        .where({ id })
        .update({ confirm_until: new Date(Date.now() - 1000) });
      again = await onMain.json('/api/photos/confirm', 'POST', { id });
    }
    expect(again.status, await again.clone().text()).toBe(200);
    const rows = await testDb()('photos').where({ id });
    expect(rows).toHaveLength(1);
    const stored = (await getObjectBytes(rows[0].object_key))!;
    expect(createHash('sha256').update(stored).digest('hex')).toBe(rows[0].sha256);
    expect(await objectExists(rows[0].upload_key)).toBe(false);

    // The suite's server never noticed.
    expect((await onMain.fetch(`/api/grid/${block.id}`)).status).toBe(200);
  });
});
