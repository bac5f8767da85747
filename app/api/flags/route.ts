import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { listFlags } from '@/lib/server/queries/flags';
import { flagListQuerySchema } from '@/lib/validation/flag';

/** GET /api/flags?block=&status=open|closed|all&untasked=1 — the organisation's flags, by block, row and vine. */
export const GET = memberRoute({ query: flagListQuerySchema }, async (member, { query }) => ({
  flags: await listFlags(db(), member.organisationId, query),
}));
