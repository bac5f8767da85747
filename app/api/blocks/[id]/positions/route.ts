import type { SlotList } from '@/lib/contracts/blocks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { listSlots, numberParam } from '@/lib/server/services/blocks';
import { idParams } from '@/lib/validation/params';

/** The planting slots of one row (`?row=N`), or of the whole block, with their status. */
export const GET = memberRoute({ params: idParams('a block'), response: responds<SlotList>() }, async (member, { params, req }) => {
  const row = req.nextUrl.searchParams.get('row');
  return listSlots(member, params.id, row === null ? undefined : numberParam(row, 'row'));
});
