/**
 * Whatever happens between the phone and the server — reloads, a closed tab mid-request, no
 * network, a server that stored a batch whose answer never came back or answered for only half of
 * it, another person signing in (even mid-drain) —
 * every record and photo saved on the phone ends up on the server exactly once, under the session
 * of the person who saved it, and is on the phone or the server at every moment in between.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { memoryStore } from '@/lib/offline/memory-store';
import { FakeServer, jpeg, record, settle, setup, uuid, type Outcome } from './fakes';

const OWNERS = ['scout-a', 'scout-b'] as const;
type Owner = (typeof OWNERS)[number];

type Step =
  | { kind: 'enqueue'; owner: Owner; collection: 'observations' | 'flags'; photo: boolean }
  | { kind: 'drain'; outcomes: Outcome[] }
  | { kind: 'reload' }
  | { kind: 'crash'; before: Outcome[] }
  | { kind: 'sign-in'; owner: Owner }
  | { kind: 'sign-in-mid-drain'; owner: Owner };

const outcome = fc.constantFrom<Outcome>('ok', 'ok', 'offline', 'timeout', 'lost', 'lost', 'partial', { status: 503 }, { status: 502 });
const step: fc.Arbitrary<Step> = fc.oneof(
  {
    weight: 4,
    arbitrary: fc.record({
      kind: fc.constant('enqueue' as const),
      owner: fc.constantFrom(...OWNERS),
      collection: fc.constantFrom('observations' as const, 'flags' as const),
      photo: fc.boolean(),
    }),
  },
  { weight: 3, arbitrary: fc.record({ kind: fc.constant('drain' as const), outcomes: fc.array(outcome, { maxLength: 6 }) }) },
  { weight: 1, arbitrary: fc.constant({ kind: 'reload' as const }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('crash' as const), before: fc.array(outcome, { maxLength: 3 }) }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('sign-in' as const), owner: fc.constantFrom(...OWNERS) }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('sign-in-mid-drain' as const), owner: fc.constantFrom(...OWNERS) }) },
);

async function run(steps: Step[]) {
  const store = memoryStore();
  const server = new FakeServer();
  let person: Owner = 'scout-a';
  server.session = person;
  let s = setup({ store, server, batchSize: 2 });
  await s.engine.start(person);
  const saved = new Map<string, { owner: Owner; payload: string }>();
  const photos = new Map<string, { owner: Owner; observationId: string }>();
  let n = 0;

  async function reload() {
    s.engine.stop();
    s = setup({ store, server, batchSize: 2 });
    await s.engine.start(person);
  }

  async function check(label: string) {
    const onPhone = new Set((await s.outbox.listObservations()).map((e) => e.id));
    for (const [id, { owner, payload }] of saved) {
      const held = server.records.get(id);
      expect(held !== undefined || onPhone.has(id), `${label}: record ${id} lost`).toBe(true);
      if (held) expect([held.payload, held.session], `${label}: record ${id} as stored`).toEqual([payload, owner]);
    }
    expect(
      [...server.records.keys()].every((id) => saved.has(id)),
      `${label}: a record the phone never saved`,
    ).toBe(true);
    const photosOnPhone = new Set((await s.outbox.listPhotos()).map((p) => p.id));
    for (const [id, { owner, observationId }] of photos) {
      const held = server.photos.get(id);
      expect(held?.state === 'stored' || photosOnPhone.has(id), `${label}: photo ${id} lost`).toBe(true);
      if (held) expect([held.observationId, new Set(held.sessions)], `${label}: photo ${id} as stored`).toEqual([observationId, new Set([owner])]);
    }
  }

  for (const [i, st] of steps.entries()) {
    const label = `step ${i} ${JSON.stringify(st)}`;
    if (st.kind === 'enqueue') {
      const r = { ...record(++n), position: n };
      await s.outbox.enqueueRecord(st.owner, st.collection, r);
      saved.set(r.id, { owner: st.owner, payload: JSON.stringify(r) });
      if (st.photo && st.collection === 'observations') {
        const id = uuid(10_000 + n);
        await s.outbox.enqueuePhoto({
          id,
          owner: st.owner,
          observationId: r.id,
          blob: jpeg(100 + n),
          contentType: 'image/jpeg',
          bytes: 100 + n,
          takenAt: '2026-02-10T08:00:00Z',
        });
        photos.set(id, { owner: st.owner, observationId: r.id });
      }
    } else if (st.kind === 'drain') {
      server.next('*', ...st.outcomes);
      await s.engine.syncNow();
    } else if (st.kind === 'reload') {
      await reload();
    } else if (st.kind === 'crash') {
      // The tab closes while a request is out: it never returns, and the page starts afresh.
      server.next('*', ...st.before, 'hang');
      void s.engine.syncNow();
      await settle();
      server.clear();
      await reload();
    } else if (st.kind === 'sign-in') {
      person = st.owner;
      server.session = person;
      await s.engine.start(person);
    } else {
      // Another person signs in (on another tab) while this drain's first request is out.
      const engine = s.engine;
      server.onRequest = () => {
        server.onRequest = undefined;
        person = st.owner;
        server.session = person;
        void engine.start(person);
      };
      await engine.syncNow();
      server.onRequest = undefined;
      await settle();
    }
    server.clear();
    await check(label);
  }

  // Back in range: each person signs in in turn and everything goes.
  for (const owner of OWNERS) {
    person = owner;
    server.session = owner;
    await reload();
    await s.engine.syncNow();
  }
  await check('at the end');
  expect(await s.outbox.listObservations()).toEqual([]);
  expect(await s.outbox.listPhotos()).toEqual([]);
  expect([...server.records.keys()].sort()).toEqual([...saved.keys()].sort());
  for (const [id, held] of server.records) expect(held.creations, id).toBe(1);
  // No record arrived twice under different ids: each vine position is stored once.
  expect(new Set([...server.records.values()].map((r) => JSON.parse(r.payload).position)).size).toBe(saved.size);
  expect(
    [...server.photos]
      .filter(([, p]) => p.state === 'stored')
      .map(([id]) => id)
      .sort(),
  ).toEqual([...photos.keys()].sort());
}

describe('the outbox under any sequence of events', () => {
  it('never loses, doubles or mixes up the owner of a record or photo', async () => {
    await fc.assert(fc.asyncProperty(fc.array(step, { maxLength: 40 }), run), { numRuns: 300 });
  });

  it('the example of the field test: a lost answer, then a resend', async () => {
    await run([
      { kind: 'enqueue', owner: 'scout-a', collection: 'observations', photo: true },
      { kind: 'enqueue', owner: 'scout-a', collection: 'observations', photo: false },
      { kind: 'drain', outcomes: ['lost'] },
      { kind: 'crash', before: [] },
    ]);
  });
});
