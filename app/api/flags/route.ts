import type { FlagList } from '@/lib/contracts/flags';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { listFlagViews } from '@/lib/server/services/flags';
import { flagListQuerySchema } from '@/lib/validation/flag';

/** GET /api/flags?block=&status=open|closed|all&untasked=1 — the organisation's flags, by block, row and vine. */
export const GET = memberRoute({ query: flagListQuerySchema, response: responds<FlagList>() }, async (member, { query }) => ({
  flags: await listFlagViews(member, query),
}));
