import 'server-only';
import { randomInt } from 'node:crypto';
import type { z } from 'zod';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getBlock, listPositions } from '@/lib/server/queries/blocks';
import { listSingleVineYields } from '@/lib/server/queries/measurements';
import { insertSamplingPlan, listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { measuredYieldSpread } from '@/lib/reports/block/crop';
import { seasonBounds, seasonOf } from '@/lib/reports/season';
import type { samplingPlanSchema } from '@/lib/validation/sampling-plan';
import { samplingPlan } from '@/lib/viticulture';

/** Draws a reproducible list of vines (the seed is stored) over the planted slots of a block. */
export const listPlans = (member: Member, blockId?: string) => listSamplingPlans(db(), member.organisationId, blockId);

export async function createSamplingPlan(member: Member, input: z.infer<typeof samplingPlanSchema>) {
  const block = await getBlock(db(), member.organisationId, input.blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.', { blockId: ['No such block'] });
  const positions = await listPositions(db(), block.id);
  const vinesPerRow: Record<number, number> = {};
  for (const p of positions) vinesPerRow[p.row_number] = Math.max(vinesPerRow[p.row_number] ?? 0, p.position);
  const seed = input.seed ?? randomInt(0, 2 ** 31 - 1);
  const options = { count: input.count, seed, avoidRowEnds: input.avoidRowEnds };
  const addresses = samplingPlan(
    {
      rows: Object.keys(vinesPerRow).map(Number),
      vinesPerRow,
      skip: positions.filter((p) => p.status === 'missing' || p.status === 'dead').map((p) => ({ row: p.row_number, position: p.position })),
    },
    options,
  );
  const id = await insertSamplingPlan(db(), {
    organisationId: member.organisationId,
    blockId: block.id,
    name: input.name,
    seed,
    options,
    addresses,
    createdBy: member.userId,
  });
  return { id, name: input.name, seed, count: addresses.length, addresses };
}

/**
 * Each block's measured spread of vine yields for the plan form's yield suggestion: last season's
 * single-vine yields, else this season's; blocks with fewer than five weighed vines are left out.
 */
export async function measuredYieldSpreads(member: Member, now = new Date()) {
  const season = seasonOf(now, member.seasonStartMonth);
  const period = { from: seasonBounds(season - 1, member.seasonStartMonth).from, to: seasonBounds(season, member.seasonStartMonth).to };
  const bySeason = new Map<string, Map<number, number[]>>();
  for (const y of await listSingleVineYields(db(), member.organisationId, period)) {
    const seasons = bySeason.get(y.blockId) ?? new Map<number, number[]>();
    const s = seasonOf(`${y.measuredOn}T12:00:00Z`, member.seasonStartMonth);
    const yields = seasons.get(s) ?? [];
    yields.push(y.kgPerVine);
    seasons.set(s, yields);
    bySeason.set(y.blockId, seasons);
  }
  const spreads = new Map<string, { cvPercent: number; vines: number; season: number }>();
  for (const [blockId, seasons] of bySeason) {
    const spread = measuredYieldSpread((s) => seasons.get(s) ?? [], season);
    if (spread) spreads.set(blockId, spread);
  }
  return spreads;
}
