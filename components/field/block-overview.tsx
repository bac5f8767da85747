'use client';

import { useTranslations } from 'next-intl';
import { ReiWarning } from '@/components/field/rei-warning';
import { RowWorkPanel } from '@/components/field/row-work-panel';
import { Notice } from '@/components/ui/field';
import { useFieldLayout } from '@/lib/offline/use-field-layout';

export function BlockOverview({ blockId, owner, recordsWork = false }: { blockId: string; owner?: string; recordsWork?: boolean }) {
  const t = useTranslations('field');
  const { data, isPending, isError } = useFieldLayout(blockId);
  if (isPending) return <p>{t('loading')}</p>;
  if (isError) return <Notice tone="warn">{t('offlineNoBlock')}</Notice>;
  const walk = (q: string) => `/field/blocks/${blockId}/walk?${q}`;
  return (
    <div className="flex flex-col gap-4">
      <div>
        <h1 className="text-3xl font-extrabold">{data.block.name}</h1>
        <p className="text-bark-soft">
          {data.block.variety}
          {data.block.positionOrigin ? ` · ${data.block.positionOrigin}` : ''}
        </p>
      </div>
      <ReiWarning sprays={data.sprays} />
      {data.plans.length > 0 && (
        <section>
          <h2 className="mb-2 text-xl font-bold">{t('plans')}</h2>
          <ul className="flex flex-col gap-2">
            {data.plans.map((p) => (
              <li key={p.id}>
                <a
                  href={walk(`plan=${p.id}`)}
                  className="flex min-h-touch items-center justify-between rounded-xl border-2 border-rootstock bg-panel px-4 font-bold no-underline"
                >
                  <span>{t('walkPlan', { name: p.name })}</span>
                  <span className="text-bark-soft">{t('planVines', { count: p.addresses.length })}</span>
                </a>
              </li>
            ))}
          </ul>
        </section>
      )}
      {recordsWork && owner && <RowWorkPanel owner={owner} blockId={blockId} rows={data.rows} />}
      <section>
        <h2 className="mb-2 text-xl font-bold">{t('rows')}</h2>
        <ul className="grid grid-cols-4 gap-2">
          {data.rows.map((r) => (
            <li key={r.row}>
              <a
                href={walk(`row=${r.row}&position=1`)}
                className="flex min-h-16 flex-col items-center justify-center rounded-xl border-2 border-line bg-panel no-underline hover:border-rootstock"
              >
                {/* The name read aloud starts with the visible text's words, so voice control finds it (WCAG 2.5.3). */}
                <span className="sr-only">{t('walkRowPrefix')} </span>
                <span className="text-xl font-extrabold">{r.row}</span>
                <span className="text-xs text-bark-soft">{t('rowVines', { count: r.vineCount })}</span>
              </a>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
