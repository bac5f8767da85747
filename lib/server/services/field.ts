import 'server-only';
import type { FieldLayout, FieldVineHistory } from '@/lib/contracts/field';
import type { Sendable } from '@/lib/contracts/http';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getBlock } from '@/lib/server/queries/blocks';
import { getFieldLayout, listVineObservations } from '@/lib/server/queries/field';
import { listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { listRecentSprays } from '@/lib/server/queries/sprays';
import { settingsForBlock } from '@/lib/server/services/settings';

async function requireBlock(member: Member, blockId: string) {
  const block = await getBlock(db(), member.organisationId, blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.');
  return block;
}

/** The block as the phone walks it: slots, open findings, recent sprays and sampling plans. */
export async function fieldLayout(member: Member, blockId: string): Promise<Sendable<FieldLayout>> {
  const block = await requireBlock(member, blockId);
  const [layout, sprays, plans, { settings }] = await Promise.all([
    getFieldLayout(db(), block.id),
    listRecentSprays(db(), member.organisationId, block.id),
    listSamplingPlans(db(), member.organisationId, block.id),
    settingsForBlock(db(), member.organisationId, block.id),
  ]);
  return {
    block: {
      id: block.id,
      name: block.name,
      variety: block.variety,
      trainingSystem: block.training_system,
      vinesPerPanel: block.vines_per_panel,
      rowCount: block.row_count,
      positionOrigin: block.position_origin,
      unitSystem: member.unitSystem,
      vineSpacingM: Number(block.vine_spacing_m),
    },
    ...layout,
    sprays,
    plans: plans.map((p) => ({ id: p.id, name: p.name, addresses: p.addresses })),
    // The block's judgement settings, so the phone's verdicts match the report's, offline too.
    settings,
    fetchedAt: new Date().toISOString(),
  };
}

/** A vine's recent observations, found by its address in a block of the member's organisation. */
export async function fieldVineHistory(member: Member, blockId: string, row: number, position: number): Promise<Sendable<FieldVineHistory>> {
  const block = await requireBlock(member, blockId);
  return { observations: await listVineObservations(db(), block.id, row, position) };
}

/**
 * The same view as the phone receives it from the route (dates as ISO strings), for the walk page
 * itself, so that the vine shows in the page's first paint.
 */
export async function fieldLayoutJson(member: Member, blockId: string): Promise<FieldLayout> {
  return JSON.parse(JSON.stringify(await fieldLayout(member, blockId))) as FieldLayout;
}
