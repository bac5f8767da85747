import type { Metadata } from 'next';
import { MyTasks } from '@/components/tasks/my-tasks';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'My tasks' };

/**
 * The phone's task list and, with ?task=, the walk through one task's vines. Both live on this one
 * path so the service worker's copy of the page serves any task with no signal.
 */
export default async function FieldTasksPage() {
  const member = await memberForPage('complete-task');
  return <MyTasks owner={member.email} />;
}
