import { isUuid } from '@/lib/grid/filters';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { getTaskDetail, updateTask } from '@/lib/server/services/tasks';
import { updateTaskSchema } from '@/lib/validation/task';

const notFound = () => new AppError('not-found', 'No such task in your organisation.');

/** GET /api/tasks/:id — the task, its vines in walking order and why each is in it. */
export const GET = memberRoute({}, async (member, { params }) => {
  if (!isUuid(params.id)) throw notFound();
  return getTaskDetail(member, params.id);
});

/** PATCH /api/tasks/:id — reassign, move the due date, change priority or cancel. */
export const PATCH = memberRoute({ permission: 'manage-tasks', body: updateTaskSchema }, async (member, { params, body }) => {
  if (!isUuid(params.id)) throw notFound();
  return updateTask(member, params.id, body);
});
