'use client';

import { useFormatter, useTranslations } from 'next-intl';
import { syncNow } from '@/lib/offline/sync';
import { useSyncStatus } from '@/lib/offline/use-sync-status';
import { cn } from '@/lib/cn';

/** Always on screen in the field: connection, what waits, progress, last send, what needs a person. */
export function SyncStatusBar() {
  const t = useTranslations('sync');
  const format = useFormatter();
  const s = useSyncStatus();
  return (
    <section
      aria-label="Sync"
      data-testid="sync-status"
      data-sticky-top
      data-waiting={s.counted ? s.waiting : undefined}
      data-photos-waiting={s.counted ? s.photosWaiting : undefined}
      className={cn('sticky top-0 z-20 -mx-3 border-b-2 px-3 py-1 text-sm sm:mx-0', s.online ? 'border-line bg-panel' : 'border-cut bg-cut-tint')}
    >
      {/* One line in the usual case; it wraps rather than push "Sync now" off a narrow screen when photos wait too. */}
      <div className="mx-auto flex max-w-md flex-wrap items-center gap-x-3">
        <span className="flex shrink-0 items-center gap-1 font-bold" data-testid="connection">
          <span aria-hidden className={cn('inline-block size-3 rounded-full', s.online ? 'bg-rootstock' : 'border-2 border-cut')} />
          {s.online ? t('online') : t('offline')}
        </span>
        {/* Never "nothing waiting" before the outbox is read: a record on the phone would look sent. */}
        <span className="shrink-0 font-bold" data-testid="waiting">
          {s.counted ? t('waiting', { count: s.waiting }) : t('counting')}
        </span>
        {s.photosWaiting > 0 && (
          <span className="shrink-0" data-testid="photos-waiting">
            {t('photosWaiting', { count: s.photosWaiting })}
          </span>
        )}
        <span className="min-w-0 flex-1 truncate text-bark-soft" aria-live="polite">
          {s.progress
            ? t('sending', {
                records: s.progress.records,
                recordsTotal: s.progress.recordsTotal,
                kb: Math.round(s.progress.bytes / 1024),
                kbTotal: Math.round(s.progress.bytesTotal / 1024),
              })
            : s.lastSyncedAt
              ? t('lastSynced', { time: format.relativeTime(s.lastSyncedAt) })
              : t('never')}
        </span>
        <button
          type="button"
          onClick={() => void syncNow()}
          disabled={s.running}
          className="ml-auto min-h-11 shrink-0 rounded-lg border-2 border-rootstock bg-panel px-3 font-bold text-rootstock disabled:opacity-60"
        >
          {t('syncNow')}
        </button>
      </div>
      <div className="mx-auto max-w-md">
        {s.signedOut && (
          <p className="font-bold text-alarm" role="alert">
            {t('signedOut')}{' '}
            <a href="/signin?callbackUrl=/field" className="underline">
              {t('signIn')}
            </a>
          </p>
        )}
        {!s.signedOut && s.problem && s.online && <p className="text-cut">{s.problem}</p>}
        {(s.rejected.length > 0 || s.rejectedPhotos.length > 0) && (
          <p className="font-bold text-alarm" role="alert">
            {t('rejected', { count: s.rejected.length + s.rejectedPhotos.length })}{' '}
            <a href="/field/outbox" className="underline">
              {t('review')}
            </a>
          </p>
        )}
        {s.otherOwners > 0 && <p className="text-bark-soft">{t('otherOwners', { count: s.otherOwners })}</p>}
      </div>
    </section>
  );
}
