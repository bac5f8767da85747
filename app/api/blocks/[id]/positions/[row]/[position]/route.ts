import { memberRoute } from '@/lib/server/http';
import { getSlot, numberParam, setSlotStatus } from '@/lib/server/services/blocks';
import { slotStatusSchema } from '@/lib/validation/block';
import { blockSlotParams } from '@/lib/validation/params';

/** One planting slot with the vines that stood in it. */
export const GET = memberRoute({ params: blockSlotParams }, async (member, { params }) =>
  getSlot(member, params.id, numberParam(params.row, 'row'), numberParam(params.position, 'vine')),
);

export const PATCH = memberRoute({ permission: 'manage-organisation', body: slotStatusSchema, params: blockSlotParams }, async (member, { params, body }) =>
  setSlotStatus(member, params.id, numberParam(params.row, 'row'), numberParam(params.position, 'vine'), body),
);
