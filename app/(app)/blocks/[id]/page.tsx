import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { BlockDetail } from '@/components/blocks/block-detail';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { getBlock } from '@/lib/server/queries/blocks';

export const metadata: Metadata = { title: 'Block' };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function BlockPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await memberForPage();
  const { id } = await params;
  if (!UUID.test(id) || !(await getBlock(db(), member.organisationId, id))) notFound();
  return (
    <div className="flex flex-col gap-4">
      <Link href="/blocks" className="font-bold text-rootstock underline">
        ← All blocks
      </Link>
      <BlockDetail blockId={id} units={member.unitSystem} canManage={can(member.role, 'manage-organisation')} />
    </div>
  );
}
