import { NextResponse } from 'next/server';
import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { blockProgress, listTaskItems, listTasks } from '@/lib/server/queries/tasks';
import { createTasks } from '@/lib/server/services/tasks';
import { createTasksSchema, taskListQuerySchema } from '@/lib/validation/task';

/**
 * GET /api/tasks?status=&assignee=me|<id>&block=&priority=&items=1 — tasks with their progress, and
 * progress per block. `assignee=me&items=1` is the phone's copy for working offline.
 */
export const GET = memberRoute({ query: taskListQuerySchema }, async (member, { query: q }) => {
  const tasks = await listTasks(db(), member.organisationId, {
    status: q.status,
    assigneeId: q.assignee === 'me' ? member.userId : q.assignee,
    block: q.block,
    priority: q.priority,
  });
  const [items, progress] = await Promise.all([
    q.items
      ? listTaskItems(
          db(),
          tasks.map((t) => t.id),
        )
      : undefined,
    blockProgress(db(), member.organisationId),
  ]);
  return NextResponse.json(
    {
      tasks: items ? tasks.map((t) => ({ ...t, items: items.filter((i) => i.taskId === t.id) })) : tasks,
      progress,
      fetchedAt: new Date().toISOString(),
    },
    { headers: { 'Cache-Control': 'private, no-store' } },
  );
});

/** POST /api/tasks — a manager turns flags into tasks (one per block) for one person. */
export const POST = memberRoute({ permission: 'manage-tasks', body: createTasksSchema }, async (member, { body }) =>
  NextResponse.json({ tasks: await createTasks(member, body) }, { status: 201 }),
);
