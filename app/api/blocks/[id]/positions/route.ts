import { memberRoute } from '@/lib/server/http';
import { listSlots, numberParam } from '@/lib/server/services/blocks';

/** The planting slots of one row (`?row=N`), or of the whole block, with their status. */
export const GET = memberRoute({}, async (member, { params, req }) => {
  const row = req.nextUrl.searchParams.get('row');
  return listSlots(member, String(params.id), row === null ? undefined : numberParam(row, 'row'));
});
