'use client';

import { useFormatter, useNow, useTranslations } from 'next-intl';
import type { FieldLayout } from '@/lib/offline/use-field-layout';

/** Shown before anyone enters a block whose last recorded spray's re-entry interval has not ended. */
export function ReiWarning({ sprays }: { sprays: FieldLayout['sprays'] }) {
  const t = useTranslations('field.rei');
  const format = useFormatter();
  const now = useNow({ updateInterval: 60_000 });
  const when = (iso: string) => format.dateTime(new Date(iso), { weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });
  const active = sprays.filter((s) => new Date(s.reentryAt).getTime() > now.getTime()).sort((a, b) => Date.parse(b.reentryAt) - Date.parse(a.reentryAt))[0];
  if (active) {
    return (
      <div role="alert" data-testid="rei-warning" className="rounded-xl border-4 border-alarm bg-alarm-tint p-4">
        <p className="text-xl font-extrabold text-alarm">⚠ {t('title')}</p>
        <p className="mt-1 text-lg">{t('body', { product: active.product, appliedAt: when(active.appliedAt), endsAt: when(active.reentryAt) })}</p>
        <p className="mt-2 text-sm">{t('defer')}</p>
      </div>
    );
  }
  const last = sprays[0];
  if (!last) return null;
  return <p className="text-sm text-bark-soft">{t('recent', { product: last.product, endsAt: when(last.reentryAt) })}</p>;
}
