'use client';

import { useQuery } from '@tanstack/react-query';
import { useTranslations } from 'next-intl';
import { Notice } from '@/components/ui/field';
import { apiGet } from '@/lib/api-client';
import type { BlockList, BlockSummary } from '@/lib/contracts/blocks';

/** `initial` is the page's own render of the list, so the blocks show in the first paint. */
export function FieldBlockList({ initial }: { initial?: BlockSummary[] }) {
  const t = useTranslations('field');
  const { data, isPending, isError } = useQuery({
    queryKey: ['blocks'],
    queryFn: async () => (await apiGet<BlockList>('/api/blocks')).blocks,
    networkMode: 'always',
    initialData: initial,
  });
  if (isPending) return <p>{t('loading')}</p>;
  if (isError) return <Notice tone="warn">{t('offlineNoBlock')}</Notice>;
  if (data.length === 0) return <Notice>{t('noBlocks')}</Notice>;
  return (
    <ul className="flex flex-col gap-2">
      {data.map((b) => (
        <li key={b.id}>
          {/* A plain link: a full page load works offline from the service worker's copy. */}
          <a
            href={`/field/blocks/${b.id}`}
            className="flex min-h-16 flex-col justify-center rounded-xl border-2 border-line bg-panel px-4 py-2 no-underline hover:border-rootstock"
          >
            <span className="text-lg font-extrabold">{b.name}</span>
            <span className="text-bark-soft">{t('blockSummary', { variety: b.variety, rows: b.rowCount, vines: b.vineCount })}</span>
          </a>
        </li>
      ))}
    </ul>
  );
}
