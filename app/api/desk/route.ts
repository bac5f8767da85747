import type { DeskAnswer } from '@/lib/contracts/desk';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { loadDesk } from '@/lib/server/services/desk';

/** GET /api/desk — the Desk of the person's role in their current organisation; a manager's call counts as a look. */
export const GET = memberRoute({ response: responds<DeskAnswer>() }, async (member) => ({ desk: await loadDesk(member) }));
