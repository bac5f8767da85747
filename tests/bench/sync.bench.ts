import { randomUUID } from 'node:crypto';
import { Client } from '../helpers/http';
import { median, type BenchContext } from './context';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const BATCH = 200;
const BATCHES = 25;

function records(n: number) {
  return Array.from({ length: n }, (_, i) => ({
    id: randomUUID(),
    blockId: UPPER_TERRACE,
    row: (i % 24) + 1,
    position: (i % 60) + 1,
    kind: 'weak-budbreak',
    data: { budsRetained: 30, budsPushed: 10 + (i % 20) },
    note: '',
    observedAt: new Date().toISOString(),
  }));
}

/** Sync ingest through the real route, against a raw multi-row insert of the same rows. */
export default async function syncBench(ctx: BenchContext) {
  const scout = new Client();
  await scout.signIn('scout@example.com', 'vineward-demo');
  await scout.json('/api/sync', 'POST', { observations: records(BATCH) }); // warm-up

  const routeMs: number[] = [];
  for (let b = 0; b < BATCHES; b++) {
    const batch = records(BATCH);
    const t = performance.now();
    const res = await scout.json('/api/sync', 'POST', { observations: batch });
    const { results } = (await res.json()) as { results: { status: string }[] };
    routeMs.push(performance.now() - t);
    if (results.some((r) => r.status !== 'created')) throw new Error('bench batch not fully created');
  }

  const template = await ctx.db('observations').where({ block_id: UPPER_TERRACE }).first();
  const slots = await ctx.db('vine_positions').where({ block_id: UPPER_TERRACE }).select('id', 'row_number', 'position');
  const slotId = new Map(slots.map((s) => [`${s.row_number}:${s.position}`, s.id]));
  const rawMs: number[] = [];
  for (let b = 0; b < BATCHES; b++) {
    const rows = records(BATCH).map((r) => ({
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
    const t = performance.now();
    await ctx.db('observations').insert(rows);
    rawMs.push(performance.now() - t);
  }
  const total = (ms: number[]) => ms.reduce((a, b) => a + b, 0);
  const routeRate = (BATCH * BATCHES) / (total(routeMs) / 1000);
  const rawRate = (BATCH * BATCHES) / (total(rawMs) / 1000);
  ctx.report(
    `sync ingest: ${routeRate.toFixed(0)} observations/s through POST /api/sync in batches of ${BATCH} (target ≥ 3,000), ` +
      `raw Knex insert ${rawRate.toFixed(0)}/s, ratio ${(routeRate / rawRate).toFixed(2)} (target ≥ 0.4); median batch ${median(routeMs).toFixed(0)} ms`,
  );
}
