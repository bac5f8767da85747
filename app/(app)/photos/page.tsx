import type { Metadata } from 'next';
import { Suspense } from 'react';
import { PhotoLog } from '@/components/photos/photo-log';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { listGridBlocks } from '@/lib/server/queries/grid';
import { listMembers } from '@/lib/server/queries/organisations';

export const metadata: Metadata = { title: 'Photo log' };

export default async function PhotosPage() {
  const member = await memberForPage();
  const [blocks, members] = await Promise.all([listGridBlocks(db(), member.organisationId), listMembers(db(), member.organisationId)]);
  return (
    <Suspense>
      <PhotoLog
        blocks={blocks.map((b) => ({ id: b.id, name: b.name, rowCount: b.rowCount }))}
        people={members.filter((m) => m.role !== 'advisor').map((m) => ({ id: m.userId, name: m.name ?? m.email }))}
      />
    </Suspense>
  );
}
