import { describe, expect, it } from 'vitest';
import { FakeServer, PUT, jpeg, record, settle, setup, uuid } from './fakes';

const SYNC = '/api/sync';
const PRESIGN = '/api/photos/presign';
const CONFIRM = '/api/photos/confirm';

const states = async (s: ReturnType<typeof setup>) => (await s.outbox.listObservations()).map((e) => e.state);

describe('records: each state of the outbox', () => {
  it('queued: a saved record waits on the phone and is counted for its owner', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    s.server.always('offline');
    await s.engine.start('scout-a');
    expect(await states(s)).toEqual(['queued']);
    expect(s.engine.getStatus()).toMatchObject({ counted: true, waiting: 1, rejected: [], otherOwners: 0 });
  });

  it('sending: while the request is out the records are marked sending and the drain shows progress', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.outbox.enqueueObservation('scout-a', record(2));
    const seen: unknown[] = [];
    s.server.onRequest = async () => {
      seen.push(await states(s), s.engine.getStatus().running, { ...s.engine.getStatus().progress });
    };
    await s.engine.start('scout-a');
    expect(seen).toEqual([['sending', 'sending'], true, { records: 0, recordsTotal: 2, bytes: 0, bytesTotal: 0 }]);
    expect(s.engine.getStatus()).toMatchObject({ running: false, progress: null });
  });

  it('acknowledged: created and duplicate both remove the record, and the drain counts as a sync', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.engine.start('scout-a');
    expect(s.server.records.has(uuid(1))).toBe(true);
    // The same record again (another tab had sent it): the server answers duplicate.
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.engine.syncNow();
    expect(await s.outbox.listObservations()).toEqual([]);
    expect(s.server.records.get(uuid(1))!.creations).toBe(1);
    expect(s.engine.getStatus()).toMatchObject({ waiting: 0, problem: null, online: true, lastSyncedAt: s.time.clock.now() });
    expect(s.lastSynced()).toBe(s.time.clock.now());
  });

  it("rejected: kept, shown with the server's errors, and not sent again until a person fixes it", async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1, { budsRetained: -1, budsPushed: 3 }));
    await s.outbox.enqueueObservation('scout-a', record(2));
    await s.engine.start('scout-a');
    const [kept] = await s.outbox.listObservations();
    expect(kept).toMatchObject({ id: uuid(1), state: 'rejected', errors: [{ field: 'data.budsRetained', message: 'Must be 0 or more.' }] });
    expect(s.engine.getStatus().rejected.map((e) => e.id)).toEqual([uuid(1)]);
    expect(s.engine.getStatus().waiting).toBe(0);

    await s.engine.syncNow();
    expect(s.server.sent(SYNC)).toHaveLength(1);

    await s.outbox.replaceObservation(record(1, { budsRetained: 30, budsPushed: 3 }));
    await s.engine.syncNow();
    expect(await s.outbox.listObservations()).toEqual([]);
    expect(s.server.records.has(uuid(1))).toBe(true);
  });

  it('conflict: kept beside the server’s other record; kept as new it is sent under a new id with its photos', async () => {
    const s = setup();
    s.server.records.set(uuid(1), { collection: 'observations', payload: '{"other":true}', session: 'scout-b', creations: 1 });
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(1),
      blob: jpeg(300),
      contentType: 'image/jpeg',
      bytes: 300,
      takenAt: '2026-02-10T08:00:00Z',
    });
    await s.engine.start('scout-a');
    const [kept] = await s.outbox.listObservations();
    expect(kept).toMatchObject({ id: uuid(1), state: 'rejected', conflict: true, errors: [{ field: 'id' }] });
    expect(await s.outbox.listPhotos()).toMatchObject([{ state: 'queued' }]); // waits for its record
    expect(s.server.sent(PRESIGN)).toHaveLength(0);

    await s.outbox.reissueObservation(uuid(1));
    await s.engine.syncNow();
    expect(await s.outbox.listObservations()).toEqual([]);
    expect(await s.outbox.listPhotos()).toEqual([]);
    const [newId] = [...s.server.records.keys()].filter((id) => id !== uuid(1));
    expect(s.server.photos.get(uuid(50))).toMatchObject({ observationId: newId, state: 'stored' });
  });

  it('a 200 that is not JSON (a login page, a proxy) is no acknowledgement', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    s.server.next(SYNC, { status: 200 });
    await s.engine.start('scout-a');
    expect(await states(s)).toEqual(['queued']);
    expect(s.engine.getStatus().problem).toBe('Vineward did not answer properly; will try again.');
  });

  it('a JSON 200 without results is no acknowledgement either, and leaves nothing marked sending', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    s.server.next(SYNC, { status: 200, json: { status: 'ok' } });
    await s.engine.start('scout-a');
    expect(await states(s)).toEqual(['queued']);
    expect(s.engine.getStatus().problem).toBe('Vineward did not answer properly; will try again.');
    await s.time.advance(2000);
    expect(await s.outbox.listObservations()).toEqual([]);
  });

  it('records the server did not answer for stay queued', async () => {
    const s = setup();
    for (let n = 1; n <= 3; n++) await s.outbox.enqueueObservation('scout-a', record(n));
    s.server.next(SYNC, { status: 200, json: { results: [{ id: uuid(1), status: 'created' }] } });
    await s.engine.start('scout-a');
    expect((await s.outbox.listObservations()).map((e) => [e.id, e.state])).toEqual([
      [uuid(2), 'queued'],
      [uuid(3), 'queued'],
    ]);
  });

  it('a result naming another id, or more results than records, settles nothing wrongly and leaves nothing sending', async () => {
    const s = setup();
    for (let n = 1; n <= 2; n++) await s.outbox.enqueueObservation('scout-a', record(n));
    s.server.next(SYNC, {
      status: 200,
      json: {
        results: [
          { id: uuid(1), status: 'created' },
          { id: uuid(7), status: 'created' },
          { id: uuid(8), status: 'created' },
        ],
      },
    });
    await s.engine.start('scout-a');
    expect((await s.outbox.listObservations()).map((e) => [e.id, e.state])).toEqual([[uuid(2), 'queued']]);
  });

  it('sends oldest first, in batches, one collection after another in the order of COLLECTIONS', async () => {
    const s = setup({ batchSize: 2 });
    await s.outbox.enqueueRecord('scout-a', 'task-updates', { ...record(9), taskId: 't1' });
    for (let n = 1; n <= 5; n++) {
      await s.outbox.enqueueObservation('scout-a', record(n));
      await s.time.advance(1);
    }
    await s.outbox.enqueueRecord('scout-a', 'flags', { ...record(8), reason: 'replant' });
    await s.outbox.enqueueRecord('scout-a', 'no-such-collection', record(7));
    await s.engine.start('scout-a');
    expect(s.server.requests.map((r) => [r.path, Object.values(r.body as object)[0].map((x: { position: number }) => x.position)])).toEqual([
      [SYNC, [1, 2]],
      [SYNC, [3, 4]],
      [SYNC, [5]],
      ['/api/sync/flags', [8]],
      ['/api/sync/task-updates', [9]],
    ]);
    expect(Object.keys(s.server.requests[4]!.body as object)).toEqual(['taskUpdates']);
    // A collection this version does not know waits rather than going to the wrong endpoint.
    expect(await s.outbox.listObservations()).toMatchObject([{ id: uuid(7), state: 'queued' }]);
  });
});

describe('a batch the server refuses as a whole', () => {
  it.each([
    [422, 'At most 500 records per request'],
    [400, 'The request body is not valid JSON.'],
  ])("a %i marks each record of the batch rejected with the server's message, and does not resend it", async (code, message) => {
    const s = setup({ batchSize: 2 });
    for (let n = 1; n <= 3; n++) await s.outbox.enqueueObservation('scout-a', record(n));
    s.server.next(SYNC, { status: code, json: { error: { code: 'refused', message } } });
    await s.engine.start('scout-a');
    const entries = await s.outbox.listObservations();
    expect(entries.map((e) => [e.id, e.state, e.errors])).toEqual([
      [uuid(1), 'rejected', [{ field: 'batch', message }]],
      [uuid(2), 'rejected', [{ field: 'batch', message }]],
    ]);
    // The next batch still went, and the refused one is not sent again by the timer.
    expect(s.server.records.has(uuid(3))).toBe(true);
    expect(s.engine.getStatus().rejected).toHaveLength(2);
    await s.time.advance(10 * 60_000);
    expect(s.server.sent(SYNC)).toHaveLength(2);
  });

  it('a 413 splits the batch in halves until each part fits; only a record too large on its own is rejected', async () => {
    const s = setup({ batchSize: 4 });
    for (let n = 1; n <= 4; n++) await s.outbox.enqueueObservation('scout-a', record(n));
    const message = 'The request is larger than 2000000 bytes.';
    const tooLarge = { status: 413, json: { error: { code: 'too-large', message } } };
    // All four together, then the first half [1, 2], then record 1 alone are too large.
    s.server.next(SYNC, tooLarge, tooLarge, tooLarge);
    await s.engine.start('scout-a');
    const batches = s.server.sent(SYNC).map((r) => (r.body as { observations: { position: number }[] }).observations.map((o) => o.position));
    expect(batches).toEqual([[1, 2, 3, 4], [1, 2], [1], [2], [3, 4]]);
    expect([uuid(2), uuid(3), uuid(4)].every((id) => s.server.records.has(id))).toBe(true);
    expect((await s.outbox.listObservations()).map((e) => [e.id, e.state, e.errors])).toEqual([[uuid(1), 'rejected', [{ field: 'batch', message }]]]);
  });

  it('without a message the rejection still says what happened', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    s.server.next(SYNC, { status: 400, json: {} });
    await s.engine.start('scout-a');
    expect((await s.outbox.listObservations())[0]!.errors).toEqual([{ field: 'batch', message: 'The server refused the batch (400).' }]);
  });

  it.each([408, 429])('a %i is "later", not "no": the batch stays queued and is retried', async (code) => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    s.server.next(SYNC, { status: code, json: { error: { code: 'slow-down', message: 'Too many requests.' } } });
    await s.engine.start('scout-a');
    expect(await states(s)).toEqual(['queued']);
    await s.time.advance(s.engine.getStatus().nextAttemptAt! - s.time.clock.now());
    expect(await s.outbox.listObservations()).toEqual([]);
  });
});

describe('back-off', () => {
  it.each(['offline', 'timeout', { status: 503, json: { error: { message: 'Database unavailable.' } } }, { status: 500 }] as const)(
    'after %j the records stay queued and are retried with a growing delay',
    async (outcome) => {
      const s = setup();
      await s.outbox.enqueueObservation('scout-a', record(1));
      s.server.always(outcome);
      const delays: number[] = [];
      await s.engine.start('scout-a');
      for (let i = 0; i < 9; i++) {
        expect(await states(s)).toEqual(['queued']);
        const delay = s.engine.getStatus().nextAttemptAt! - s.time.clock.now();
        delays.push(delay);
        await s.time.advance(delay);
      }
      // 2 s doubling, capped at 5 minutes (jitter held at its middle by the test's random()).
      expect(delays).toEqual([2000, 4000, 8000, 16_000, 32_000, 64_000, 128_000, 256_000, 300_000]);
      expect(s.engine.getStatus().problem).toBeTruthy();
      if (outcome === 'offline' || outcome === 'timeout') expect(s.engine.getStatus().online).toBe(false);

      s.server.always(undefined);
      await s.time.advance(s.engine.getStatus().nextAttemptAt! - s.time.clock.now());
      expect(await s.outbox.listObservations()).toEqual([]);
      expect(s.engine.getStatus()).toMatchObject({ problem: null, online: true });
      // Nothing waits: the next look is the idle minute.
      expect(s.engine.getStatus().nextAttemptAt! - s.time.clock.now()).toBe(60_000);
    },
  );

  it('the delay is jittered by ±25%', async () => {
    for (const [random, delay] of [
      [0, 1500],
      [1, 2500],
    ] as const) {
      const s = setup();
      await s.outbox.enqueueObservation('scout-a', record(1));
      s.server.always('offline');
      const { createSyncEngine } = await import('@/lib/offline/engine');
      const engine = createSyncEngine({
        outbox: s.outbox,
        transport: s.server.transport,
        lock: { ifFree: (fn) => fn() },
        clock: s.time.clock,
        collections: [{ name: 'observations', path: SYNC, bodyKey: 'observations' }],
        batchSize: 200,
        random: () => random,
      });
      await engine.start('scout-a');
      expect(engine.getStatus().nextAttemptAt! - s.time.clock.now()).toBe(delay);
    }
  });

  it('coming back online starts the back-off afresh and sends at once', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    s.server.always('offline');
    await s.engine.start('scout-a');
    for (let i = 0; i < 4; i++) await s.time.advance(s.engine.getStatus().nextAttemptAt! - s.time.clock.now());
    expect(s.engine.getStatus().nextAttemptAt! - s.time.clock.now()).toBe(32_000);
    s.engine.disconnected();
    expect(s.engine.getStatus().online).toBe(false);
    s.server.always(undefined);
    await s.engine.reconnected();
    expect(await s.outbox.listObservations()).toEqual([]);

    await s.outbox.enqueueObservation('scout-a', record(2));
    s.server.always('offline');
    await s.engine.syncNow();
    expect(s.engine.getStatus().nextAttemptAt! - s.time.clock.now()).toBe(2000);
  });

  it('what is left after a good drain is looked at again a second later', async () => {
    const s = setup();
    await s.outbox.enqueueRecord('scout-a', 'no-such-collection', record(1));
    await s.engine.start('scout-a');
    expect(s.engine.getStatus().nextAttemptAt! - s.time.clock.now()).toBe(1000);
  });
});

describe('sessions and owners', () => {
  it('401 keeps every record and photo, says so, and sends them after signing in again', async () => {
    const s = setup();
    s.server.session = null;
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.outbox.enqueueObservation('scout-a', record(2));
    await s.engine.start('scout-a');
    expect(await states(s)).toEqual(['queued', 'queued']);
    expect(s.engine.getStatus()).toMatchObject({ signedOut: true, waiting: 2, problem: 'Sign in again to send what is waiting. Nothing is lost.' });

    // The records went in another drain; a photo meets the 401 at its first step.
    s.server.session = 'scout-a';
    await s.engine.syncNow();
    await s.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(1),
      blob: jpeg(100),
      contentType: 'image/jpeg',
      bytes: 100,
      takenAt: '2026-02-10T08:00:00Z',
    });
    s.server.session = null;
    await s.engine.syncNow();
    expect(await s.outbox.listPhotos()).toMatchObject([{ state: 'queued' }]);
    expect(s.engine.getStatus()).toMatchObject({ signedOut: true, photosWaiting: 1 });

    s.server.session = 'scout-a';
    await s.engine.start('scout-a');
    expect(await s.outbox.listPhotos()).toEqual([]);
    expect(s.engine.getStatus().signedOut).toBe(false);
  });

  it("one person's records wait for them and are never sent with another's session", async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(1),
      blob: jpeg(100),
      contentType: 'image/jpeg',
      bytes: 100,
      takenAt: '2026-02-10T08:00:00Z',
    });
    await s.outbox.enqueueObservation('scout-b', record(2));
    s.server.session = 'scout-b';
    await s.engine.start('scout-b');
    expect([...s.server.records.keys()]).toEqual([uuid(2)]);
    expect(s.server.sent(PRESIGN)).toHaveLength(0);
    expect(s.engine.getStatus()).toMatchObject({ waiting: 0, otherOwners: 2 });
    expect((await s.outbox.listObservations()).map((e) => e.owner)).toEqual(['scout-a']);

    s.server.session = 'scout-a';
    await s.engine.start('scout-a');
    expect(s.server.records.get(uuid(1))!.session).toBe('scout-a');
    expect(s.server.photos.get(uuid(50))!.state).toBe('stored');
  });

  it('a drain that began for one person stops when another signs in on this phone', async () => {
    const s = setup({ batchSize: 1 });
    for (let n = 1; n <= 3; n++) await s.outbox.enqueueObservation('scout-a', record(n));
    await s.outbox.enqueueObservation('scout-b', record(4));
    s.server.onRequest = (path, body) => {
      // During scout-a's first batch, scout-b signs in (the cookie changes) and the field shell starts the sync for them.
      if ((body as { observations: { id: string }[] }).observations[0]!.id === uuid(1)) {
        s.server.session = 'scout-b';
        void s.engine.start('scout-b');
      }
    };
    await s.engine.syncNow(); // no owner yet: nothing happens
    expect(s.server.requests).toHaveLength(0);
    await s.engine.start('scout-a');
    await settle();
    expect([...s.server.records.keys()]).toEqual([uuid(1)]);
    // scout-b's drain comes next, a second later, and sends only theirs.
    await s.time.advance(1000);
    expect([...s.server.records].map(([id, held]) => [id, held.session])).toEqual([
      [uuid(1), 'scout-a'],
      [uuid(4), 'scout-b'],
    ]);
    expect((await s.outbox.listObservations()).map((e) => [e.id, e.owner])).toEqual([
      [uuid(2), 'scout-a'],
      [uuid(3), 'scout-a'],
    ]);
  });
  it('a photo whose upload began for one person is confirmed only under their session', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.engine.start('scout-a');
    await s.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(1),
      blob: jpeg(100),
      contentType: 'image/jpeg',
      bytes: 100,
      takenAt: '2026-02-10T08:00:00Z',
    });
    s.server.onRequest = (path) => {
      if (path !== PRESIGN) return;
      s.server.onRequest = undefined;
      s.server.session = 'scout-b';
      void s.engine.start('scout-b');
    };
    await s.engine.syncNow();
    await settle();
    expect(s.server.sent(CONFIRM)).toHaveLength(0);
    expect(await s.outbox.listPhotos()).toMatchObject([{ state: 'uploaded', owner: 'scout-a' }]);

    s.server.session = 'scout-a';
    await s.engine.start('scout-a');
    expect(s.server.sent(CONFIRM).map((r) => r.session)).toEqual(['scout-a']);
    expect(await s.outbox.listPhotos()).toEqual([]);
  });
});

describe('photos: presign → PUT → confirm', () => {
  async function withPhoto(options: { bytes?: number } = {}) {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    await s.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(1),
      blob: jpeg(options.bytes ?? 1000),
      contentType: 'image/jpeg',
      bytes: options.bytes ?? 1000,
      takenAt: '2026-02-10T08:00:00Z',
    });
    return s;
  }
  const photo = async (s: ReturnType<typeof setup>) => (await s.outbox.listPhotos())[0];

  it('goes after its record, uploads, confirms, and leaves the phone; progress counts its bytes', async () => {
    const s = await withPhoto({ bytes: 4096 });
    const seen: string[] = [];
    s.server.onRequest = (path) => void seen.push(path);
    await s.engine.start('scout-a');
    expect(seen).toEqual([SYNC, PRESIGN, PUT, CONFIRM]);
    expect(s.server.photos.get(uuid(50))).toEqual({ observationId: uuid(1), state: 'stored', bytes: 4096, sessions: ['scout-a', 'scout-a'] });
    expect(await s.outbox.listPhotos()).toEqual([]);
    expect(s.engine.getStatus().photosWaiting).toBe(0);
  });

  it('waits while its record is still on the phone', async () => {
    const s = await withPhoto();
    s.server.next(SYNC, 'offline');
    await s.engine.start('scout-a');
    expect(s.server.sent(PRESIGN)).toHaveLength(0);
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 0 });
  });

  it('presign: no connection keeps it queued with one more attempt; a 5xx keeps it queued', async () => {
    const s = await withPhoto();
    s.server.next(PRESIGN, 'offline');
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 1 });
    s.server.next(PRESIGN, { status: 503, json: { error: { message: 'Storage unavailable.' } } });
    await s.engine.syncNow();
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 2 });
    await s.engine.syncNow();
    expect(await s.outbox.listPhotos()).toEqual([]);
  });

  it("presign: a 4xx rejects the photo with the server's message", async () => {
    const s = await withPhoto();
    s.server.next(PRESIGN, { status: 422, json: { error: { message: 'Photos up to 15 MB.' } } });
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'rejected', error: 'Photos up to 15 MB.' });
    expect(s.engine.getStatus().rejectedPhotos).toHaveLength(1);
    await s.engine.syncNow();
    expect(s.server.sent(PRESIGN)).toHaveLength(1);
  });

  it('PUT: an interrupted upload or storage refusing it keeps it queued, to be presigned again', async () => {
    const s = await withPhoto();
    s.server.next(PUT, 'offline');
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 1 });
    expect(s.engine.getStatus().problem).toBe('The photo upload was interrupted; will try again.');
    s.server.next(PUT, { status: 403 });
    await s.engine.syncNow();
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 2 });
    expect(s.engine.getStatus().problem).toBe('Storage refused the upload (403).');
    await s.engine.syncNow();
    expect(s.server.sent(PRESIGN)).toHaveLength(3);
    expect(await s.outbox.listPhotos()).toEqual([]);
  });

  it('confirm: a lost answer or a 5xx keeps it uploaded, and the next drain only confirms', async () => {
    const s = await withPhoto();
    s.server.next(CONFIRM, 'offline', { status: 502 });
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'uploaded' });
    await s.engine.syncNow();
    expect(await photo(s)).toMatchObject({ state: 'uploaded' });
    expect(s.engine.getStatus().photosWaiting).toBe(1);
    await s.engine.syncNow();
    expect(await s.outbox.listPhotos()).toEqual([]);
    expect([s.server.sent(PRESIGN).length, s.server.sent(PUT).length, s.server.sent(CONFIRM).length]).toEqual([1, 1, 2]);
  });

  it('confirm: 409 (the object is not there yet) queues it again from the start', async () => {
    const s = await withPhoto();
    s.server.next(CONFIRM, { status: 409, json: { error: { message: 'The photo has not arrived yet.' } } });
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 1 });
    await s.engine.syncNow();
    expect(await s.outbox.listPhotos()).toEqual([]);
  });

  it("confirm: a 4xx (not a picture) rejects it with the server's message", async () => {
    const s = await withPhoto();
    s.server.next(CONFIRM, { status: 422, json: { error: { message: 'This file is not a photo.' } } });
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'rejected', error: 'This file is not a photo.' });
  });

  it('presign or confirm answered 429 or 408 (try later) keeps the photo, never rejects it', async () => {
    const s = await withPhoto();
    s.server.next(PRESIGN, { status: 429, json: { error: { message: 'Too many requests.' } } });
    await s.engine.start('scout-a');
    expect(await photo(s)).toMatchObject({ state: 'queued', attempts: 1 });
    s.server.next(CONFIRM, { status: 408, json: { error: { message: 'Request timeout.' } } });
    await s.engine.syncNow();
    expect(await photo(s)).toMatchObject({ state: 'uploaded' });
    await s.engine.syncNow();
    expect(await s.outbox.listPhotos()).toEqual([]);
  });

  it('a photo the server already holds is confirmed without uploading again', async () => {
    const s = await withPhoto();
    await s.engine.start('scout-a');
    await s.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(1),
      blob: jpeg(1000),
      contentType: 'image/jpeg',
      bytes: 1000,
      takenAt: '2026-02-10T08:00:00Z',
    });
    await s.engine.syncNow();
    expect(s.server.sent(PUT)).toHaveLength(1);
    expect(await s.outbox.listPhotos()).toEqual([]);
  });
});

describe('the engine as a whole', () => {
  it('start puts back what a closed tab left in flight', async () => {
    const server = new FakeServer();
    const first = setup({ server });
    await first.outbox.enqueueObservation('scout-a', record(1));
    await first.outbox.enqueuePhoto({
      id: uuid(50),
      owner: 'scout-a',
      observationId: uuid(9),
      blob: jpeg(10),
      contentType: 'image/jpeg',
      bytes: 10,
      takenAt: '2026-02-10T08:00:00Z',
    });
    await first.outbox.patchObservations([uuid(1)], { state: 'sending' });
    await first.outbox.patchPhoto(uuid(50), { state: 'uploading' });
    server.always('offline');
    const second = setup({ store: first.store, server });
    await second.engine.start('scout-a');
    expect(await states(second)).toEqual(['queued']);
    expect(await second.outbox.listPhotos()).toMatchObject([{ state: 'queued' }]);
  });

  it('calls while a drain runs collapse into it', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    let release!: () => void;
    s.server.onRequest = () => new Promise<void>((resolve) => (release = resolve));
    const first = s.engine.start('scout-a');
    await settle();
    await Promise.all([s.engine.syncNow(), s.engine.syncNow()]);
    release();
    await first;
    expect(s.server.requests).toHaveLength(1);
  });

  it('tells its subscribers of every change of status', async () => {
    const s = setup();
    await s.outbox.enqueueObservation('scout-a', record(1));
    const running: boolean[] = [];
    const unsubscribe = s.engine.subscribe(() => running.push(s.engine.getStatus().running));
    await s.engine.start('scout-a');
    unsubscribe();
    expect(running).toContain(true);
    expect(running.at(-1)).toBe(false);
    const count = running.length;
    await s.engine.syncNow();
    expect(running).toHaveLength(count);
  });

  it('stop cancels the timer', async () => {
    const s = setup();
    await s.engine.start('scout-a');
    expect(s.time.pending()).toBe(1);
    s.engine.stop();
    expect(s.time.pending()).toBe(0);
  });
});
