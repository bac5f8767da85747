import type { TaskDetail } from '@/lib/contracts/tasks';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { getTaskDetail, updateTask } from '@/lib/server/services/tasks';
import { idParams } from '@/lib/validation/params';
import { updateTaskSchema } from '@/lib/validation/task';

const params = idParams('a task');
const response = responds<TaskDetail>();

/** GET /api/tasks/:id — the task, its vines in walking order and why each is in it. */
export const GET = memberRoute({ params, response }, async (member, { params }) => getTaskDetail(member, params.id));

/** PATCH /api/tasks/:id — reassign, move the due date, change priority or cancel. */
export const PATCH = memberRoute({ permission: 'manage-tasks', body: updateTaskSchema, params, response }, async (member, { params, body }) =>
  updateTask(member, params.id, body),
);
