import type { Metadata } from 'next';
import { BlockOverview } from '@/components/field/block-overview';
import { can } from '@/lib/roles';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Block' };

// The layout comes from /api/field/blocks/[id] in the browser, so the page itself works offline.
export default async function FieldBlockPage({ params }: { params: Promise<{ blockId: string }> }) {
  const member = await memberForPage();
  const { blockId } = await params;
  return <BlockOverview blockId={blockId} owner={member.email} recordsWork={can(member.role, 'record-row-work')} />;
}
