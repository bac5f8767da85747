import { randomUUID } from 'node:crypto';
import { loadavg } from 'node:os';
import type { Knex } from 'knex';
import { SYNC_BATCH_LIMIT } from '@/lib/contracts/sync';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';
import { serverModules } from './estate';
import { keptAlive } from './keep-alive';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const BATCH = SYNC_BATCH_LIMIT;
const BATCHES = 12;
/** Batches of each sent first and not counted, so the server's compiler has warmed to the route as a running server has. */
const WARM = 5;

export interface IngestTarget {
  blockId: string;
  rows: number;
  vinesPerRow: number;
  email: string;
}

function records(n: number, t: IngestTarget) {
  return Array.from({ length: n }, (_, i) => ({
    id: randomUUID(),
    blockId: t.blockId,
    row: (i % t.rows) + 1,
    position: (i % t.vinesPerRow) + 1,
    kind: 'weak-budbreak',
    data: { budsRetained: 30, budsPushed: 10 + (i % 20) },
    note: '',
    observedAt: new Date().toISOString(),
  }));
}

async function rawRows(db: Knex, t: IngestTarget) {
  const template = await db('observations').where({ block_id: t.blockId }).first('organisation_id', 'recorded_by');
  const slots = await db('vine_positions').where({ block_id: t.blockId }).select('id', 'row_number', 'position');
  const slotId = new Map(slots.map((s) => [`${s.row_number}:${s.position}`, s.id]));
  return () =>
    records(BATCH, t).map((r) => ({
      id: r.id,
      organisation_id: template.organisation_id,
      block_id: r.blockId,
      position_id: slotId.get(`${r.row}:${r.position}`),
      row_number: r.row,
      position: r.position,
      kind: r.kind,
      data: JSON.stringify(r.data),
      note: r.note,
      observed_at: r.observedAt,
      recorded_by: template.recorded_by,
      severity: 1,
      payload_sha256: 'bench',
    }));
}

/**
 * Sync ingest through the real route against a raw multi-row insert of the same kind of rows into
 * the same table (its grid-summary triggers included), batches of each taken in turn so that both
 * see the same machine load.
 */
export async function measureIngest(ctx: BenchContext, t: IngestTarget, label: string) {
  const scout = new Client();
  await scout.signIn(t.email, 'vineward-demo');
  const raw = await rawRows(ctx.db, t);
  serverModules();
  const { ingestObservations } = await import('@/lib/server/queries/observations');
  const member = await ctx.db('users as u').join('memberships as m', 'm.user_id', 'u.id').where('u.email', t.email).first('u.id', 'm.organisation_id');
  // The route's one statement run from here: what the database spends, without HTTP, session and validation.
  const statement = () =>
    ingestObservations(
      ctx.db,
      member.organisation_id,
      member.id,
      false,
      records(BATCH, t).map((r) => ({
        id: r.id,
        block_id: r.blockId,
        row_number: r.row,
        position: r.position,
        kind: r.kind,
        data: r.data,
        note: r.note,
        observed_at: r.observedAt,
        severity: 1,
        payload_sha256: 'bench',
      })),
    );
  const device = keptAlive(ctx.appUrl, scout.cookieHeader);
  const viaHttp = async () => {
    const { status, json } = await device.post('/api/sync', { observations: records(BATCH, t) });
    const results = (json as { results?: { status: string }[] }).results;
    if (status !== 200 || !results || results.some((r) => r.status !== 'created')) throw new Error(`bench batch not fully created (${status})`);
  };
  const viaFetch = async () => {
    const res = await scout.json('/api/sync', 'POST', { observations: records(BATCH, t) });
    const { results } = (await res.json()) as { results: { status: string }[] };
    if (results.some((r) => r.status !== 'created')) throw new Error('bench batch not fully created');
  };
  for (let w = 0; w < WARM; w++) {
    await viaHttp();
    await viaFetch();
    await ctx.db('observations').insert(raw());
    await statement();
  }

  const routeMs: number[] = [];
  const fetchMs: number[] = [];
  const rawMs: number[] = [];
  const statementMs: number[] = [];
  for (let b = 0; b < BATCHES; b++) {
    let started = performance.now();
    await viaHttp();
    routeMs.push(performance.now() - started);
    started = performance.now();
    await viaFetch();
    fetchMs.push(performance.now() - started);
    const rows = raw();
    started = performance.now();
    await ctx.db('observations').insert(rows);
    rawMs.push(performance.now() - started);
    started = performance.now();
    await statement();
    statementMs.push(performance.now() - started);
  }
  const total = (ms: number[]) => ms.reduce((a, b) => a + b, 0);
  const routeRate = (BATCH * BATCHES) / (total(routeMs) / 1000);
  const rawRate = (BATCH * BATCHES) / (total(rawMs) / 1000);
  const statementRate = (BATCH * BATCHES) / (total(statementMs) / 1000);
  const fetchRate = (BATCH * BATCHES) / (total(fetchMs) / 1000);
  const sorted = [...routeMs].sort((a, b) => a - b);
  ctx.report(
    `sync ingest${label}: ${routeRate.toFixed(0)} observations/s through POST /api/sync (node:http) in batches of ${BATCH} (target ≥ 3,000), ` +
      `raw Knex multi-row insert ${rawRate.toFixed(0)}/s, ratio ${(routeRate / rawRate).toFixed(2)} (target ≥ 0.7); ` +
      `the route's one statement run from the bench ${statementRate.toFixed(0)}/s (${(statementRate / rawRate).toFixed(2)} of raw); ` +
      `the route through undici's fetch ${fetchRate.toFixed(0)}/s (${(fetchRate / rawRate).toFixed(2)} of raw); ` +
      `batch median ${median(routeMs).toFixed(0)} ms, p95 ${percentile(sorted, 95).toFixed(0)} ms; load average ${loadavg()[0]!.toFixed(2)}`,
  );
  device.close();
  await ctx.db('observations').where({ payload_sha256: 'bench' }).delete();
}

/** Sync ingest on the demo's Upper Terrace. */
export default async function syncBench(ctx: BenchContext) {
  await measureIngest(ctx, { blockId: UPPER_TERRACE, rows: 24, vinesPerRow: 60, email: 'scout@example.com' }, '');
}
