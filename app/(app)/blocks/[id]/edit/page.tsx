import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { BlockForm } from '@/components/blocks/block-form';
import { Notice } from '@/components/ui/field';
import { memberForPage } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { getBlockDetail } from '@/lib/server/services/blocks';

export const metadata: Metadata = { title: 'Edit block' };

export default async function EditBlockPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await memberForPage('manage-organisation');
  const { id } = await params;
  const detail = await getBlockDetail(member, id).catch((err) => {
    if (err instanceof AppError && err.code === 'not-found') notFound();
    throw err;
  });
  return (
    <div className="flex max-w-3xl flex-col gap-4">
      <h1 className="text-3xl font-extrabold">Edit {detail.block.name}</h1>
      {detail.block.archivedAt ? (
        <Notice tone="warn">This block is archived. Restore it from its page before changing it.</Notice>
      ) : (
        <BlockForm units={member.unitSystem} block={detail.block} />
      )}
    </div>
  );
}
