import type { Metadata } from 'next';
import Link from 'next/link';
import { TasksTable } from '@/components/tasks/tasks-table';
import { ButtonLink } from '@/components/ui/button';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Tasks' };

export default async function TasksPage() {
  const member = await memberForPage();
  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-bark-soft">{member.organisationName}</p>
          <h1 className="text-3xl font-extrabold">Tasks</h1>
          <p className="mt-1">
            Work made from{' '}
            <Link href="/flags" className="font-bold text-rootstock underline">
              flags
            </Link>
            , checked off vine by vine in the field. ·{' '}
            <Link href="/tasks/pruning-checks" className="font-bold text-rootstock underline">
              Pruning checks
            </Link>{' '}
            ·{' '}
            <Link href="/settings/notifications" className="font-bold text-rootstock underline">
              Mail settings
            </Link>
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {can(member.role, 'complete-task') && (
            <ButtonLink href="/field/tasks" variant="secondary">
              My tasks on the phone
            </ButtonLink>
          )}
          {can(member.role, 'manage-tasks') && <ButtonLink href="/flags">Make tasks from flags</ButtonLink>}
        </div>
      </div>
      <TasksTable />
    </div>
  );
}
