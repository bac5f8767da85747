import { NextResponse } from 'next/server';
import { responds } from '@/lib/contracts/http';
import type { CreatedTasks, TaskList } from '@/lib/contracts/tasks';
import { memberRoute } from '@/lib/server/http';
import { createTasks, listTaskViews } from '@/lib/server/services/tasks';
import { createTasksSchema, taskListQuerySchema } from '@/lib/validation/task';

/**
 * GET /api/tasks?status=&assignee=me|<id>&block=&priority=&items=1 — tasks with their progress, and
 * progress per block. `assignee=me&items=1` is the phone's copy for working offline.
 */
export const GET = memberRoute({ query: taskListQuerySchema, response: responds<TaskList>() }, async (member, { query }) =>
  NextResponse.json(await listTaskViews(member, query), { headers: { 'Cache-Control': 'private, no-store' } }),
);

/** POST /api/tasks — a manager turns flags into tasks (one per block) for one person. */
export const POST = memberRoute({ permission: 'manage-tasks', body: createTasksSchema, response: responds<CreatedTasks>() }, async (member, { body }) =>
  NextResponse.json({ tasks: await createTasks(member, body) }, { status: 201 }),
);
