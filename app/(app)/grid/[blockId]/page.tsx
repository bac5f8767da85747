import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { Suspense } from 'react';
import { GridView } from '@/components/grid/grid-view';
import { isUuid } from '@/lib/grid/filters';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { getBlock } from '@/lib/server/queries/blocks';
import { listMembers } from '@/lib/server/queries/organisations';

export const metadata: Metadata = { title: 'Row grid' };

export default async function BlockGridPage({ params }: { params: Promise<{ blockId: string }> }) {
  const member = await memberForPage();
  const { blockId } = await params;
  const block = isUuid(blockId) ? await getBlock(db(), member.organisationId, blockId) : undefined;
  if (!block) notFound();
  const members = await listMembers(db(), member.organisationId);
  return (
    <Suspense>
      <GridView
        block={{
          id: block.id,
          name: block.name,
          variety: block.variety,
          positionOrigin: block.position_origin,
          rowCount: block.row_count,
          vinesPerRow: block.vines_per_row,
        }}
        people={members.filter((m) => m.role !== 'advisor').map((m) => ({ id: m.userId, name: m.name ?? m.email }))}
      />
    </Suspense>
  );
}
