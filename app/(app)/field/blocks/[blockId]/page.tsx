import type { Metadata } from 'next';
import { BlockOverview } from '@/components/field/block-overview';

export const metadata: Metadata = { title: 'Block' };

// The layout comes from /api/field/blocks/[id] in the browser, so the page itself works offline.
export default async function FieldBlockPage({ params }: { params: Promise<{ blockId: string }> }) {
  const { blockId } = await params;
  return <BlockOverview blockId={blockId} />;
}
