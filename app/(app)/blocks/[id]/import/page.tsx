import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { LayoutImport } from '@/components/blocks/layout-import';
import { memberForPage } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { getBlockDetail } from '@/lib/server/services/blocks';

export const metadata: Metadata = { title: 'Import layout' };

export default async function ImportLayoutPage({ params }: { params: Promise<{ id: string }> }) {
  const member = await memberForPage('manage-organisation');
  const { id } = await params;
  const { block } = await getBlockDetail(member, id).catch((err) => {
    if (err instanceof AppError && err.code === 'not-found') notFound();
    throw err;
  });
  return (
    <div className="flex max-w-3xl flex-col gap-4">
      <Link href={`/blocks/${block.id}`} className="font-bold text-rootstock underline">
        ← {block.name}
      </Link>
      <h1 className="text-3xl font-extrabold">Import the layout of {block.name}</h1>
      <LayoutImport blockId={block.id} blockName={block.name} firstRow={block.firstRow} />
    </div>
  );
}
