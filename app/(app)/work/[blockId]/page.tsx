import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { BlockProgressView } from '@/components/work/block-progress-view';
import { memberForPage } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { currentSeason, loadBlockProgress } from '@/lib/server/services/row-work';

export const metadata: Metadata = { title: 'Block progress' };

export default async function BlockProgressPage({
  params,
  searchParams,
}: {
  params: Promise<{ blockId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const member = await memberForPage();
  const { blockId } = await params;
  const raw = (await searchParams).season;
  const now = currentSeason(member);
  const season = typeof raw === 'string' && /^\d{4}$/.test(raw) ? Number(raw) : now;
  const progress = await loadBlockProgress(member, blockId, season).catch((err) => {
    if (err instanceof AppError && err.code === 'not-found') notFound();
    throw err;
  });
  return <BlockProgressView progress={progress.block} season={season} pay={progress.pay} seasons={[now - 2, now - 1, now]} />;
}
