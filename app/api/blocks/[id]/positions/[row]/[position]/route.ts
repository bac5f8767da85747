import { memberRoute } from '@/lib/server/http';
import { getSlot, numberParam, setSlotStatus } from '@/lib/server/services/blocks';
import { slotStatusSchema } from '@/lib/validation/block';

/** One planting slot with the vines that stood in it. */
export const GET = memberRoute({}, async (member, { params }) =>
  getSlot(member, String(params.id), numberParam(params.row, 'row'), numberParam(params.position, 'vine')),
);

export const PATCH = memberRoute({ permission: 'manage-organisation', body: slotStatusSchema }, async (member, { params, body }) =>
  setSlotStatus(member, String(params.id), numberParam(params.row, 'row'), numberParam(params.position, 'vine'), body),
);
