import type { Metadata } from 'next';
import Link from 'next/link';
import { FlagsTable } from '@/components/flags/flags-table';
import { isUuid } from '@/lib/grid/filters';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Flags' };

export default async function FlagsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await memberForPage();
  // The Desk links here with a block and "not in a task" chosen.
  const search = await searchParams;
  const block = typeof search.block === 'string' && isUuid(search.block) ? search.block : '';
  const untasked = search.untasked === '1';
  return (
    <div className="flex flex-col gap-6">
      <div>
        <p className="text-bark-soft">{member.organisationName}</p>
        <h1 className="text-3xl font-extrabold">Flags</h1>
        <p className="mt-1">
          Vines the crew flagged for extra care in the field. {can(member.role, 'manage-tasks') ? 'Tick them to make tasks; ' : ''}
          <Link href="/tasks" className="font-bold text-rootstock underline">
            see the tasks
          </Link>
          .
        </p>
      </div>
      <FlagsTable canManage={can(member.role, 'manage-tasks')} initialBlock={block} initialUntasked={untasked} />
    </div>
  );
}
