import type { DeskLook } from '@/lib/contracts/desk';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { markDeskLooked } from '@/lib/server/services/desk';

/** POST /api/desk/seen — a manager marks the Desk's new findings as seen. */
export const POST = memberRoute({ permission: 'manage-tasks', response: responds<DeskLook>() }, async (member) => markDeskLooked(member));
