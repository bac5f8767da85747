import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { Client } from '../helpers/http';
import { median, percentile, type BenchContext } from './context';

const RUNS = 6;
const CSV = readFileSync(path.join(__dirname, '../fixtures/layout/large-150x150.csv'), 'utf8');

/**
 * A 150 × 150 layout (22,500 slots, with statuses) through the route handlers as a manager:
 * preview against a 2 × 2 block, apply onto it, and creating a 150 × 150 block from the form.
 */
export default async function layoutImportBench(ctx: BenchContext) {
  const manager = new Client();
  await manager.signIn('manager@example.com', 'vineward-demo');
  const create = async (rows: number, vines: number) => {
    const res = await manager.json('/api/blocks', 'POST', {
      name: `Bench ${randomUUID().slice(0, 8)}`,
      variety: 'Bench Noir',
      trainingSystem: 'cane',
      rowSpacingM: 2.5,
      vineSpacingM: 1.2,
      rowCount: rows,
      vinesPerRow: vines,
      firstRow: 1,
      rowOrder: 'ascending',
    });
    if (res.status !== 201) throw new Error(`create failed: ${res.status} ${await res.text()}`);
    return (await res.json()).block.id as string;
  };
  const timed = async (work: () => Promise<Response>) => {
    const t = performance.now();
    const res = await work();
    const ms = performance.now() - t;
    if (res.status !== 200 && res.status !== 201) throw new Error(`failed: ${res.status} ${await res.text()}`);
    return ms;
  };
  const upload = (id: string, mode: string) => () => manager.fetch(`/api/blocks/${id}/layout?mode=${mode}`, { method: 'POST', body: CSV });

  const preview: number[] = [];
  const apply: number[] = [];
  const createLarge: number[] = [];
  const created: string[] = [];
  for (let i = 0; i <= RUNS; i++) {
    const id = await create(2, 2);
    created.push(id);
    const p = await timed(upload(id, 'preview'));
    const a = await timed(upload(id, 'apply'));
    const t = performance.now();
    created.push(await create(150, 150));
    const c = performance.now() - t;
    // The first round warms the route, the pool and PostgreSQL's caches.
    if (i > 0) {
      preview.push(p);
      apply.push(a);
      createLarge.push(c);
    }
  }
  for (const id of created) await ctx.db('blocks').where({ id }).delete();
  const line = (what: string, times: number[], target: number) =>
    `${what}: median ${median(times).toFixed(0)} ms, p95 ${percentile(
      [...times].sort((x, y) => x - y),
      95,
    ).toFixed(0)} ms ` + `(target < ${target} ms, ratio ${(median(times) / target).toFixed(2)} of target)`;
  ctx.report(line('layout CSV preview, 150 × 150 with statuses', preview, 1000));
  ctx.report(line('layout CSV apply, 150 × 150 with statuses onto a 2 × 2 block', apply, 2000));
  ctx.report(line('create a 150 × 150 block from the form route', createLarge, 2000));
}
