import type { PruningCheckReport } from '@/lib/contracts/tasks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { pruningCheckReport } from '@/lib/server/services/tasks';
import { pruningCheckQuerySchema } from '@/lib/validation/task';

/** GET /api/pruning-checks?block=&from=&to= — each pruner's deviation over the checked vines. */
export const GET = memberRoute({ query: pruningCheckQuerySchema, response: responds<PruningCheckReport>() }, async (member, { query }) =>
  pruningCheckReport(member, query),
);
