import type { FlagOne } from '@/lib/contracts/flags';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { closeOrReopenFlag, getFlagView } from '@/lib/server/services/flags';
import { flagUpdateSchema } from '@/lib/validation/flag';
import { idParams } from '@/lib/validation/params';

const params = idParams('a flag');
const response = responds<FlagOne>();

export const GET = memberRoute({ params, response }, async (member, { params }) => ({ flag: await getFlagView(member, params.id) }));

/** PATCH /api/flags/:id `{ status }` — a manager closes a flag that needs no task, or opens it again. */
export const PATCH = memberRoute({ permission: 'manage-tasks', body: flagUpdateSchema, params, response }, async (member, { params, body }) => ({
  flag: await closeOrReopenFlag(member, params.id, body.status),
}));
