import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { TaskDetail } from '@/components/tasks/task-detail';
import type { TaskDetail as TaskDetailView } from '@/lib/contracts/tasks';
import { isUuid } from '@/lib/grid/filters';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { getTaskDetail } from '@/lib/server/services/tasks';

export const metadata: Metadata = { title: 'Task' };

export default async function TaskPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await memberForPage();
  const { id } = await params;
  if (!isUuid(id)) notFound();
  const detail = await getTaskDetail(member, id).catch((err: unknown) => {
    if (err instanceof AppError && err.code === 'not-found') return null;
    throw err;
  });
  if (!detail) notFound();
  // Dates cross to the client as the JSON route would send them.
  const initial = JSON.parse(JSON.stringify(detail)) as TaskDetailView;
  return <TaskDetail initial={initial} canManage={can(member.role, 'manage-tasks')} />;
}
