import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getFlag } from '@/lib/server/queries/flags';
import { closeOrReopenFlag } from '@/lib/server/services/flags';
import { flagUpdateSchema } from '@/lib/validation/flag';
import { idParams } from '@/lib/validation/params';

const params = idParams('a flag');

const notFound = () => new AppError('not-found', 'No such flag in your organisation.');

export const GET = memberRoute({ params }, async (member, { params }) => {
  const flag = await getFlag(db(), member.organisationId, params.id);
  if (!flag) throw notFound();
  return { flag };
});

/** PATCH /api/flags/:id `{ status }` — a manager closes a flag that needs no task, or opens it again. */
export const PATCH = memberRoute({ permission: 'manage-tasks', body: flagUpdateSchema, params }, async (member, { params, body }) => ({
  flag: await closeOrReopenFlag(member, params.id, body.status),
}));
