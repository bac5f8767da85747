import type { BlockPassProgress } from '@/lib/contracts/row-work';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { blockProgressContract } from '@/lib/server/services/row-work';
import { idParams } from '@/lib/validation/params';
import { progressQuerySchema } from '@/lib/validation/row-work';

/** GET /api/blocks/{id}/progress?season=YYYY — each pass's rows, vines, hours, pace, finish and cost (DESIGN.md, "Row work"). */
export const GET = memberRoute(
  { params: idParams('a block'), query: progressQuerySchema, response: responds<BlockPassProgress>() },
  async (member, { params, query }) => blockProgressContract(member, params.id, query.season),
);
