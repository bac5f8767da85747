import { memberRoute } from '@/lib/server/http';
import { loadDesk } from '@/lib/server/services/desk';

/** GET /api/desk — the Desk of the person's role in their current organisation; a manager's call counts as a look. */
export const GET = memberRoute({}, async (member) => ({ desk: await loadDesk(member) }));
