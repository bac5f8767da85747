import 'server-only';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getBlock } from '@/lib/server/queries/blocks';
import { getFieldLayout } from '@/lib/server/queries/field';
import { listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { listRecentSprays } from '@/lib/server/queries/sprays';
import type { FieldLayout } from '@/lib/offline/use-field-layout';

/**
 * The block as the phone walks it: read by the route the phone refreshes from, and by the walk
 * page itself, so the vine shows in the page's first paint.
 */
export async function getFieldLayoutView(member: Member, blockId: string) {
  const block = await getBlock(db(), member.organisationId, blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.');
  const [layout, sprays, plans] = await Promise.all([
    getFieldLayout(db(), block.id),
    listRecentSprays(db(), member.organisationId, block.id),
    listSamplingPlans(db(), member.organisationId, block.id),
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
    },
    ...layout,
    sprays,
    plans: plans.map((p) => ({ id: p.id, name: p.name, addresses: p.addresses })),
    fetchedAt: new Date().toISOString(),
  };
}

/** The same view as the phone receives it from the route: JSON, dates as ISO strings. */
export async function getFieldLayoutJson(member: Member, blockId: string): Promise<FieldLayout> {
  return JSON.parse(JSON.stringify(await getFieldLayoutView(member, blockId))) as FieldLayout;
}
