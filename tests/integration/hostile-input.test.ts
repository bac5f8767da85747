/**
 * Hostile input, route by route: every route under app/api is found on disk and must have a row
 * below, so a new route without one fails this file. Each row sends what a careless or hostile
 * client would (malformed JSON, wrong types, a 20 MB body with and without Content-Length, ids that
 * are not UUIDs, another organisation's ids, wrong content types, a change from another site), and
 * expects the 4xx JSON error for it. No answer may be a 5xx, and PostgreSQL must hold exactly what
 * it held before each route's cases ran.
 */
import { randomUUID } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { raw, type RawAnswer } from '../helpers/raw';

const API = path.resolve(__dirname, '../../app/api');
const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;
type Method = (typeof METHODS)[number];

/** "POST /api/blocks/[id]/archive" for every exported handler of every route.ts under app/api. */
function routesOnDisk() {
  const found: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.name === 'route.ts') {
        const source = readFileSync(full, 'utf8');
        const route = `/api/${path.relative(API, dir).split(path.sep).join('/')}`;
        for (const m of METHODS) if (new RegExp(`export (const|async function) ${m}\\b`).test(source)) found.push(`${m} ${route}`);
      }
    }
  };
  walk(API);
  return found.sort();
}

// The sign-in routes (next-auth's /api/auth/*) have their own limits and encodings; the sign-in
// work covers them (tests/integration/sign-in.test.ts), so they have no row here.
const EXCLUDED = /^(GET|POST) \/api\/auth\//;

type Body = 'json' | 'csv' | 'none' | 'token';
interface Ids {
  block: string;
  position: string;
  flag: string;
  task: string;
  measurement: string;
  photo: string;
  mail: string;
  invitation: string;
}
interface Row {
  /** Who calls it: a manager of the organisation, or nobody signed in. */
  public?: boolean;
  /** What a change reads: JSON, a CSV file, nothing, or the unsubscribe token (JSON or a form). */
  body?: Body;
  /** The path with valid ids and query, for the body and content-type cases. */
  path?: (ours: Ids) => string;
  /** The same call naming another organisation's row: 404. */
  foreign?: (theirs: Ids) => string;
  /** A body that passes validation, so the foreign case reaches the organisation check. */
  valid?: unknown;
  /** Query parameters that hold ids, each sent as "not-an-id": 422. */
  idQuery?: string[];
}

const today = () => new Date().toISOString().slice(0, 10);

const ROWS: Record<string, Row> = {
  'GET /api/blocks': {},
  'POST /api/blocks': { body: 'json' },
  'GET /api/blocks/[id]': { foreign: (t) => `/api/blocks/${t.block}` },
  'PATCH /api/blocks/[id]': { body: 'json', foreign: (t) => `/api/blocks/${t.block}`, valid: { name: 'Taken over' } },
  'POST /api/blocks/[id]/archive': { body: 'none', foreign: (t) => `/api/blocks/${t.block}/archive` },
  'POST /api/blocks/[id]/restore': { body: 'none', foreign: (t) => `/api/blocks/${t.block}/restore` },
  'GET /api/blocks/[id]/layout.csv': { foreign: (t) => `/api/blocks/${t.block}/layout.csv` },
  'POST /api/blocks/[id]/layout': {
    body: 'csv',
    path: (o) => `/api/blocks/${o.block}/layout?mode=apply`,
    foreign: (t) => `/api/blocks/${t.block}/layout?mode=apply`,
    valid: 'row,vines\n1,1\n',
  },
  'GET /api/blocks/[id]/progress': { foreign: (t) => `/api/blocks/${t.block}/progress` },
  'GET /api/blocks/[id]/positions': { foreign: (t) => `/api/blocks/${t.block}/positions?row=1` },
  'GET /api/blocks/[id]/positions/[row]/[position]': { foreign: (t) => `/api/blocks/${t.block}/positions/1/1` },
  'PATCH /api/blocks/[id]/positions/[row]/[position]': {
    body: 'json',
    path: (o) => `/api/blocks/${o.block}/positions/1/1`,
    foreign: (t) => `/api/blocks/${t.block}/positions/1/1`,
    valid: { status: 'dead' },
  },
  'PATCH /api/blocks/[id]/rows/[row]': {
    body: 'json',
    path: (o) => `/api/blocks/${o.block}/rows/1`,
    foreign: (t) => `/api/blocks/${t.block}/rows/1`,
    valid: { vineCount: 2 },
  },
  'GET /api/blocks/[id]/settings': { foreign: (t) => `/api/blocks/${t.block}/settings` },
  'PUT /api/blocks/[id]/settings': { body: 'json', foreign: (t) => `/api/blocks/${t.block}/settings`, valid: { overrides: { canes: { bullAboveMm: 12 } } } },
  'GET /api/comments': { path: () => `/api/comments?subject=observation&id=${randomUUID()}`, idQuery: ['id'] },
  'POST /api/comments': { body: 'json', foreign: () => '/api/comments' },
  'GET /api/desk': {},
  'POST /api/desk/seen': { body: 'none' },
  'GET /api/field/blocks/[blockId]': { foreign: (t) => `/api/field/blocks/${t.block}` },
  'GET /api/field/blocks/[blockId]/vine': { foreign: (t) => `/api/field/blocks/${t.block}/vine?row=1&position=1` },
  'GET /api/field/blocks/[blockId]/row-work': { foreign: (t) => `/api/field/blocks/${t.block}/row-work` },
  'GET /api/flags': { idQuery: ['block'] },
  'GET /api/flags/[id]': { foreign: (t) => `/api/flags/${t.flag}` },
  'PATCH /api/flags/[id]': { body: 'json', foreign: (t) => `/api/flags/${t.flag}`, valid: { status: 'closed' } },
  'GET /api/grid/[blockId]': { foreign: (t) => `/api/grid/${t.block}`, idQuery: ['by'] },
  'GET /api/health': { public: true },
  'GET /api/invitations': {},
  'POST /api/invitations': { body: 'json' },
  'DELETE /api/invitations/[id]': { body: 'none', foreign: (t) => `/api/invitations/${t.invitation}` },
  'POST /api/invitations/accept': { public: true, body: 'json' },
  'PUT /api/me/locale': { body: 'json' },
  'GET /api/me': {},
  'GET /api/measurements': {
    path: (o) => `/api/measurements?blockId=${o.block}&season=2026`,
    foreign: (t) => `/api/measurements?blockId=${t.block}&season=2026`,
    idQuery: ['blockId'],
  },
  'POST /api/measurements': { body: 'json' },
  'DELETE /api/measurements/[id]': { body: 'none', foreign: (t) => `/api/measurements/${t.measurement}` },
  'GET /api/members': {},
  'GET /api/notifications/preferences': {},
  'PUT /api/notifications/preferences': { body: 'json' },
  'GET /api/notifications/undelivered': {},
  'POST /api/notifications/undelivered/[id]': { body: 'json', foreign: (t) => `/api/notifications/undelivered/${t.mail}`, valid: { action: 'dismiss' } },
  'POST /api/notifications/unsubscribe': { public: true, body: 'token' },
  'PUT /api/organisations/current': { body: 'json' },
  'GET /api/photos': { idQuery: ['block', 'by'] },
  'GET /api/photos/[id]': { foreign: (t) => `/api/photos/${t.photo}` },
  'POST /api/photos/confirm': { body: 'json', foreign: () => '/api/photos/confirm' },
  'POST /api/photos/presign': { body: 'json' },
  'GET /api/pruning-checks': { idQuery: ['block'] },
  'GET /api/reports': {},
  'GET /api/reports/blocks/[blockId]': { foreign: (t) => `/api/reports/blocks/${t.block}` },
  'GET /api/reports/observations.csv': {
    path: () => '/api/reports/observations.csv?season=2026',
    foreign: (t) => `/api/reports/observations.csv?season=2026&blockId=${t.block}`,
    idQuery: ['blockId'],
  },
  'GET /api/reports/row-work.csv': { path: () => '/api/reports/row-work.csv?season=2026', idQuery: ['blockId'] },
  'GET /api/sampling-plans': { idQuery: ['blockId'] },
  'POST /api/sampling-plans': { body: 'json', foreign: () => '/api/sampling-plans' },
  'GET /api/settings': {},
  'PUT /api/settings': { body: 'json' },
  'GET /api/sprays': { idQuery: ['blockId'] },
  'POST /api/sprays': { body: 'json', foreign: () => '/api/sprays' },
  'POST /api/sync': { body: 'json' },
  'POST /api/sync/flags': { body: 'json' },
  'POST /api/sync/task-updates': { body: 'json' },
  'POST /api/sync/row-work': { body: 'json' },
  'GET /api/tasks': { idQuery: ['assignee', 'block'] },
  'POST /api/tasks': { body: 'json', foreign: () => '/api/tasks' },
  'GET /api/tasks/[id]': { foreign: (t) => `/api/tasks/${t.task}` },
  'PATCH /api/tasks/[id]': { body: 'json', foreign: (t) => `/api/tasks/${t.task}`, valid: { status: 'cancelled' } },
  'GET /api/vines': {
    path: (o) => `/api/vines?block=${o.block}&row=1&position=1`,
    foreign: (t) => `/api/vines?block=${t.block}&row=1&position=1`,
    idQuery: ['block'],
  },
  'GET /api/vines/[positionId]': { foreign: (t) => `/api/vines/${t.position}` },
};

/** Bodies naming another organisation's rows, for the routes whose ids travel in the body. */
const FOREIGN_BODIES: Record<string, (t: Ids, me: { userId: string }) => unknown> = {
  'POST /api/comments': (t) => ({ subject: 'vine', subjectId: t.position, body: 'Mine now' }),
  'POST /api/photos/confirm': (t) => ({ id: t.photo }),
  'POST /api/sampling-plans': (t) => ({ blockId: t.block, name: 'Their vines', count: 3 }),
  'POST /api/sprays': (t) => ({ blockId: t.block, product: 'Test sulphur', appliedAt: new Date().toISOString(), reiHours: 24 }),
  'POST /api/tasks': (t, me) => ({ flagIds: [t.flag], assigneeId: me.userId, dueOn: today() }),
};

// Tables whose rows only the app's background work changes (mail sending, sign-in counters).
const VOLATILE = new Set(['mail_outbox', 'rate_limits', 'verification_tokens', 'knex_migrations', 'knex_migrations_lock']);

/** Every table's rows, each reduced to one hash: any insert, update or delete changes it. */
async function snapshot() {
  const db = testDb();
  const tables = (
    await db('information_schema.tables').where({ table_schema: 'public', table_type: 'BASE TABLE' }).select<{ table_name: string }[]>('table_name')
  )
    .map((t) => t.table_name)
    .filter((t) => !VOLATILE.has(t))
    .sort();
  const out: Record<string, string> = {};
  for (const table of tables) {
    const [row] = (
      await db.raw(`select count(*)::text || ':' || coalesce(md5(string_agg(md5(t::text), '' order by md5(t::text))), '') as h from ?? t`, [table])
    ).rows;
    out[table] = row.h;
  }
  return out;
}

let ours: Ids;
let theirs: Ids;
let manager: Client;
let managerId: string;

/** One organisation's rows of every kind a route can be asked about, made through the API where it can be. */
async function makeRows(team: Awaited<ReturnType<typeof makeTeam>>, client: Client): Promise<Ids> {
  const block = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 4 });
  const position = await testDb()('vine_positions').where({ block_id: block.id, row_number: 1, position: 1 }).first('id');
  const flagId = randomUUID();
  const flagged = await client.json('/api/sync/flags', 'POST', {
    flags: [{ id: flagId, blockId: block.id, row: 2, position: 2, reason: 'replant', note: '', flaggedAt: new Date().toISOString() }],
  });
  expect(flagged.status).toBe(200);
  const tasks = await client.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: team.pruner.id, dueOn: today() });
  expect(tasks.status).toBe(201);
  const measured = await client.json('/api/measurements', 'POST', {
    blockId: block.id,
    kind: 'yield',
    row: 1,
    position: 1,
    weight: 2.5,
    weightUnit: 'kg',
    measuredOn: today(),
  });
  expect(measured.status).toBe(201);
  const observationId = randomUUID();
  await client.json('/api/sync', 'POST', {
    observations: [{ id: observationId, blockId: block.id, row: 1, position: 3, kind: 'note', data: {}, note: 'x', observedAt: new Date().toISOString() }],
  });
  const photoId = randomUUID();
  const presigned = await client.json('/api/photos/presign', 'POST', { id: photoId, observationId, contentType: 'image/jpeg', bytes: 1000 });
  expect(presigned.status).toBe(200);
  const [mail] = await testDb()('mail_outbox')
    .insert({
      organisation_id: team.org.id,
      user_id: team.scout.id,
      to_email: team.scout.email,
      kind: 'comment',
      dedupe_key: `hostile:${randomUUID()}`,
      subject: 'Failed',
      text_body: 'x',
      html_body: 'x',
      status: 'failed',
      attempts: 5,
    })
    .returning('id');
  const invited = await client.json('/api/invitations', 'POST', { email: `hostile-${randomUUID().slice(0, 8)}@example.com`, role: 'scout' });
  expect(invited.status).toBe(201);
  return {
    block: block.id,
    position: position.id,
    flag: flagId,
    task: (await tasks.json()).tasks[0].id,
    measurement: (await measured.json()).measurement.id,
    photo: photoId,
    mail: mail.id,
    invitation: (await invited.json()).invitation.id,
  };
}

beforeAll(async () => {
  const mine = await makeTeam();
  const other = await makeTeam();
  manager = new Client();
  await manager.signIn(mine.manager.email, PASSWORD);
  managerId = mine.manager.id;
  const stranger = new Client();
  await stranger.signIn(other.manager.email, PASSWORD);
  ours = await makeRows(mine, manager);
  theirs = await makeRows(other, stranger);
}, 120_000);
afterAll(closeTestDb);

const isIdParam = (name: string) => name === 'id' || name.endsWith('Id');

/** The route's path with each [param] filled: ids with our own (or a fresh UUID), numbers with 1. */
function fill(route: string, row: Row, override?: { param: string; value: string }) {
  if (row.path && !override) return row.path(ours);
  const own: Record<string, string> = { blockId: ours.block, positionId: ours.position };
  const idOf: Record<string, string> = {
    blocks: ours.block,
    flags: ours.flag,
    tasks: ours.task,
    measurements: ours.measurement,
    photos: ours.photo,
    undelivered: ours.mail,
    invitations: ours.invitation,
  };
  const parts = route.split('/');
  const filled = parts.map((part, i) => {
    const m = /^\[(.+)\]$/.exec(part);
    if (!m) return part;
    const name = m[1]!;
    if (override?.param === name) return override.value;
    if (isIdParam(name)) return name === 'id' ? (idOf[parts[i - 1]!] ?? randomUUID()) : (own[name] ?? randomUUID());
    return '1';
  });
  const base = filled.join('/');
  const query = row.path ? new URL(row.path(ours), 'http://x').search : '';
  return base + query;
}

interface Case {
  name: string;
  status: number;
  code: string;
  send: () => Promise<RawAnswer>;
}

const BIG = 20 * 1024 * 1024;

function casesFor(key: string, row: Row): Case[] {
  const [method, route] = key.split(' ') as [Method, string];
  const cookie: Record<string, string> = row.public ? {} : { cookie: manager.cookieHeader };
  const send =
    (p: string, headers: Record<string, string> = {}, body?: string | Buffer, stream?: { bytes: number }) =>
    () =>
      raw({ method, path: p, headers: { ...cookie, ...headers }, body, stream, timeoutMs: 60_000 });
  const at = fill(route, row);
  const type = row.body === 'csv' ? 'text/csv' : 'application/json';
  const out: Case[] = [];

  for (const [, name] of route.matchAll(/\[([^\]]+)\]/g)) {
    if (isIdParam(name!))
      out.push({
        name: `path ${name} "not-an-id"`,
        status: 422,
        code: 'invalid-input',
        send: send(fill(route, row, { param: name!, value: 'not-an-id' }), row.body && row.body !== 'none' ? { 'content-type': type } : {}),
      });
  }
  for (const q of row.idQuery ?? []) {
    const url = new URL(at, 'http://x');
    url.searchParams.set(q, 'not-an-id');
    out.push({ name: `query ${q}=not-an-id`, status: 422, code: 'invalid-input', send: send(url.pathname + url.search) });
  }
  if (row.foreign) {
    const body = FOREIGN_BODIES[key]?.(theirs, { userId: managerId }) ?? row.valid;
    const payload = body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body);
    out.push({
      name: 'another organisation’s id',
      status: 404,
      code: 'not-found',
      send: send(row.foreign(theirs), payload === undefined ? {} : { 'content-type': type }, payload),
    });
  }
  // GET bodies are never read (the framework gives GET handlers none), so only changes get these.
  if (method === 'GET') return out;

  if (!row.public)
    out.push({
      name: 'a change from another site',
      status: 403,
      code: 'cross-site',
      send: send(at, { 'content-type': type, origin: 'https://evil.example' }, '{}'),
    });
  out.push({ name: 'text/plain', status: 415, code: 'unsupported-media-type', send: send(at, { 'content-type': 'text/plain' }, '{"a":1}') });
  if (row.body !== 'token')
    out.push({ name: 'a form', status: 415, code: 'unsupported-media-type', send: send(at, { 'content-type': 'application/x-www-form-urlencoded' }, 'a=1') });
  if (row.body === 'csv')
    out.push({
      name: 'JSON where a CSV file belongs',
      status: 415,
      code: 'unsupported-media-type',
      send: send(at, { 'content-type': 'application/json' }, '{}'),
    });

  const bodyless = row.body === 'none';
  const json = { 'content-type': type };
  if (row.body === 'json' || row.body === 'token' || bodyless) {
    out.push({
      name: 'malformed JSON',
      status: bodyless ? 413 : 400,
      code: bodyless ? 'payload-too-large' : 'bad-request',
      send: send(at, { 'content-type': 'application/json' }, '{"email": "a@example.com",'),
    });
    // Scalars and arrays where an object belongs, then the usual field names with the wrong types.
    const kitchenSink = '{"email":7,"role":[],"id":{},"blockId":false,"name":7,"status":1,"vineCount":"x","action":3,"locale":5,"organisationId":1,"token":5}';
    for (const wrong of ['[1,2]', '"text"', '42', 'null', kitchenSink]) {
      out.push({
        name: `wrong types ${wrong}`,
        status: bodyless ? 413 : 422,
        code: bodyless ? 'payload-too-large' : 'invalid-input',
        send: send(at, { 'content-type': 'application/json' }, wrong),
      });
    }
  }
  out.push({ name: '20 MB with Content-Length', status: 413, code: 'payload-too-large', send: send(at, json, Buffer.alloc(BIG, ' ')) });
  out.push({ name: '20 MB streamed without Content-Length', status: 413, code: 'payload-too-large', send: send(at, json, undefined, { bytes: BIG }) });
  return out;
}

describe('hostile input', () => {
  it('has a row for every route under app/api (a new route needs one), and no row without a route', () => {
    const onDisk = routesOnDisk().filter((r) => !EXCLUDED.test(r));
    expect(onDisk.length).toBeGreaterThan(40);
    expect(
      onDisk.filter((r) => !ROWS[r]),
      'routes without a row',
    ).toEqual([]);
    expect(
      Object.keys(ROWS).filter((r) => !onDisk.includes(r)),
      'rows without a route',
    ).toEqual([]);
  });

  for (const key of routesOnDisk().filter((r) => !EXCLUDED.test(r))) {
    it(`${key}: every hostile request gets its 4xx JSON error and nothing is stored`, async () => {
      const row = ROWS[key];
      if (!row) return; // reported by the test above
      const cases = casesFor(key, row);
      const before = await snapshot();
      const wrong: string[] = [];
      for (const c of cases) {
        const res = await c.send();
        let code: string | undefined;
        try {
          code = res.json().error?.code;
        } catch {
          code = `(not JSON: ${res.text.slice(0, 80)})`;
        }
        if (res.status !== c.status || code !== c.code) wrong.push(`${c.name}: ${res.status} ${code}, expected ${c.status} ${c.code}`);
        expect(res.status, `${c.name} must never be a server error`).toBeLessThan(500);
      }
      expect(wrong).toEqual([]);
      expect(await snapshot()).toEqual(before);
    }, 120_000);
  }

  it('refuses a renamed non-image at photo confirm with 422 and keeps nothing of it', async () => {
    const before = await snapshot();
    const observationId = randomUUID();
    const block = await testDb()('blocks').where({ id: ours.block }).first('id');
    const synced = await manager.json('/api/sync', 'POST', {
      observations: [{ id: observationId, blockId: block.id, row: 2, position: 1, kind: 'note', data: {}, note: 'y', observedAt: new Date().toISOString() }],
    });
    expect(synced.status).toBe(200);
    const afterSync = await snapshot();
    const text = Buffer.from('%PDF-1.4 this is a document renamed photo.jpg\n'.repeat(40));
    const id = randomUUID();
    const presign = await (await manager.json('/api/photos/presign', 'POST', { id, observationId, contentType: 'image/jpeg', bytes: text.length })).json();
    expect((await fetch(presign.uploadUrl, { method: 'PUT', headers: presign.headers, body: new Uint8Array(text) })).status).toBe(200);
    const res = await manager.json('/api/photos/confirm', 'POST', { id });
    expect(res.status).toBe(422);
    expect((await res.json()).error.code).toBe('invalid-input');
    expect(await testDb()('photos').where({ id })).toHaveLength(0);
    expect(await snapshot()).toEqual(afterSync);
    expect(afterSync).not.toEqual(before); // the observation itself was stored
  });
  // The pixel bomb (a tiny PNG that decodes to gigapixels) is covered with the photo limits in
  // tests/integration/photos.test.ts.
});
