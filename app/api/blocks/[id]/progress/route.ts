import { memberRoute } from '@/lib/server/http';
import { blockProgressContract } from '@/lib/server/services/row-work';
import { progressQuerySchema } from '@/lib/validation/row-work';

/** GET /api/blocks/{id}/progress?season=YYYY — each pass's rows, vines, hours, pace, finish and cost (DESIGN.md, "Row work"). */
export const GET = memberRoute({}, async (member, { params, req }) => {
  const query = progressQuerySchema.parse(Object.fromEntries(req.nextUrl.searchParams));
  return blockProgressContract(member, String(params.id), query.season);
});
