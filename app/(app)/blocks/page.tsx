import type { Metadata } from 'next';
import Link from 'next/link';
import { BlocksTable } from '@/components/blocks/blocks-table';
import { ButtonLink } from '@/components/ui/button';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Blocks' };

export default async function BlocksPage() {
  const member = await memberForPage();
  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-bark-soft">{member.organisationName}</p>
          <h1 className="text-3xl font-extrabold">Blocks</h1>
        </div>
        {can(member.role, 'manage-organisation') && <ButtonLink href="/blocks/new">New block</ButtonLink>}
      </div>
      <BlocksTable units={member.unitSystem} />
      <p className="text-sm text-bark-soft">
        Lengths and areas in {member.unitSystem === 'metric' ? 'metres and hectares' : 'feet, inches and acres'} ·{' '}
        <Link href="/settings" className="underline">
          units
        </Link>
      </p>
    </div>
  );
}
