import type { SlotDetail } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { getSlot, numberParam, setSlotStatus } from '@/lib/server/services/blocks';
import { slotStatusSchema } from '@/lib/validation/block';
import { blockSlotParams } from '@/lib/validation/params';

/** One planting slot with the vines that stood in it. */
export const GET = memberRoute({ params: blockSlotParams, response: responds<SlotDetail>() }, async (member, { params }) =>
  getSlot(member, params.id, numberParam(params.row, 'row'), numberParam(params.position, 'vine')),
);

export const PATCH = memberRoute(
  { permission: 'manage-organisation', body: slotStatusSchema, params: blockSlotParams, response: responds<SlotDetail>() },
  async (member, { params, body }) => setSlotStatus(member, params.id, numberParam(params.row, 'row'), numberParam(params.position, 'vine'), body),
);
