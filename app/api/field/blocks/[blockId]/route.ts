import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getBlock } from '@/lib/server/queries/blocks';
import { getFieldLayout } from '@/lib/server/queries/field';
import { listSamplingPlans } from '@/lib/server/queries/sampling-plans';
import { listRecentSprays } from '@/lib/server/queries/sprays';
import { settingsForBlock } from '@/lib/server/services/settings';
import { blockIdParams } from '@/lib/validation/params';

/** The block as the phone walks it; the service worker keeps the last answer for offline use. */
export const GET = memberRoute({ params: blockIdParams }, async (member, { params }) => {
  const block = await getBlock(db(), member.organisationId, params.blockId);
  if (!block) throw new AppError('not-found', 'No such block in your organisation.');
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
    },
    ...layout,
    sprays,
    plans: plans.map((p) => ({ id: p.id, name: p.name, addresses: p.addresses })),
    // The block's judgement settings, so the phone's verdicts match the report's, offline too.
    settings,
    fetchedAt: new Date().toISOString(),
  };
});
