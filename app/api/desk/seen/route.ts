import { memberRoute } from '@/lib/server/http';
import { markDeskLooked } from '@/lib/server/services/desk';

/** POST /api/desk/seen — a manager marks the Desk's new findings as seen. */
export const POST = memberRoute({ permission: 'manage-tasks' }, async (member) => markDeskLooked(member));
