import type { Metadata } from 'next';
import Link from 'next/link';
import { PruningCheckReport } from '@/components/tasks/pruning-check-report';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listGridBlocks } from '@/lib/server/queries/grid';

export const metadata: Metadata = { title: 'Pruning checks' };

export default async function PruningChecksPage() {
  const member = await memberForPage();
  const blocks = await listGridBlocks(db(), member.organisationId);
  return (
    <div className="flex flex-col gap-6">
      <div>
        <p className="text-bark-soft">
          <Link href="/tasks" className="underline">
            Tasks
          </Link>{' '}
          · {member.organisationName}
        </p>
        <h1 className="text-3xl font-extrabold">Pruning checks</h1>
        <p className="mt-1">How many buds and renewal spurs each pruner leaves, against the block’s target and each vine’s plan, over the vines checked.</p>
      </div>
      <PruningCheckReport blocks={blocks.map((b) => ({ id: b.id, name: b.name }))} />
    </div>
  );
}
