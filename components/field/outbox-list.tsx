'use client';

import { useTranslations } from 'next-intl';
import { useEffect, useState } from 'react';
import dynamic from 'next/dynamic';
import { BlockSettingsProvider } from '@/components/field/field-settings';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import {
  collectionOf,
  listObservations,
  listPhotos,
  onOutboxChange,
  reissueObservation,
  removeObservation,
  removePhoto,
  replaceObservation,
  type RecordEntry,
  type PhotoEntry,
} from '@/lib/offline/outbox';
import { syncNow } from '@/lib/offline/sync';
import type { FlagReason } from '@/lib/validation/flag';
import type { ObservationKind } from '@/lib/viticulture';
import type { RowWorkPass } from '@/lib/work/passes';

const ObservationForm = dynamic(() => import('@/components/field/observation-form').then((m) => m.ObservationForm));

/** Everything still on this phone, and a way to fix or discard what the server refused. */
export function OutboxList({ owner, imperial }: { owner: string; imperial: boolean }) {
  const t = useTranslations();
  const [records, setRecords] = useState<RecordEntry[]>([]);
  const [photos, setPhotos] = useState<PhotoEntry[]>([]);
  const [editing, setEditing] = useState<RecordEntry>();

  useEffect(() => {
    const load = () => {
      void listObservations().then((all) => setRecords(all.filter((e) => e.owner === owner)));
      void listPhotos().then((all) => setPhotos(all.filter((p) => p.owner === owner)));
    };
    load();
    return onOutboxChange(load);
  }, [owner]);

  if (editing) {
    return (
      <BlockSettingsProvider blockId={String(editing.record.blockId)}>
        <ObservationForm
          kind={editing.record.kind as ObservationKind}
          imperial={imperial}
          allowNext={false}
          initial={{ data: editing.record.data as Record<string, unknown>, note: String(editing.record.note ?? '') }}
          onCancel={() => setEditing(undefined)}
          onSave={async (saved) => {
            await replaceObservation({ ...editing.record, data: saved.data, note: saved.note });
            setEditing(undefined);
            void syncNow();
          }}
        />
      </BlockSettingsProvider>
    );
  }

  if (records.length === 0 && photos.length === 0) return <Notice tone="ok">{t('outbox.empty')}</Notice>;

  return (
    <ul className="flex flex-col gap-2">
      {records.map((e) => (
        <li key={e.id} className={`rounded-xl border-2 bg-panel p-3 ${e.state === 'rejected' ? 'border-alarm' : 'border-line'}`} data-testid="outbox-record">
          <p className="font-bold">
            {collectionOf(e) === 'flags'
              ? t('outbox.flag', { reason: t(`flag.reasons.${e.record.reason as FlagReason}`) })
              : collectionOf(e) === 'task-updates'
                ? t('outbox.taskUpdate')
                : collectionOf(e) === 'row-work'
                  ? t('outbox.rowWork', { pass: t(`work.passes.${e.record.pass as RowWorkPass}`), row: e.record.row })
                  : t(`kinds.${e.record.kind as ObservationKind}`)}
            {collectionOf(e) !== 'row-work' && <> · {t('field.address', { row: e.record.row, position: e.record.position })}</>}
          </p>
          <p className="text-sm text-bark-soft">{e.state === 'rejected' ? t('outbox.rejected') : t('outbox.queued')}</p>
          {e.errors?.map((err) => (
            <p key={err.field + err.message} className="text-sm font-bold text-alarm">
              {err.field}: {err.message}
            </p>
          ))}
          {e.state === 'rejected' && (
            <div className="mt-2 flex flex-wrap gap-2">
              {e.conflict ? (
                <Button type="button" onClick={() => void reissueObservation(e.id).then(() => syncNow())}>
                  {t('outbox.keepAsNew')}
                </Button>
              ) : collectionOf(e) !== 'observations' ? null : (
                <Button type="button" onClick={() => setEditing(e)}>
                  {t('outbox.edit')}
                </Button>
              )}
              <Button type="button" variant="danger" onClick={() => window.confirm(t('outbox.confirmDiscard')) && void removeObservation(e.id)}>
                {t('outbox.discard')}
              </Button>
            </div>
          )}
        </li>
      ))}
      {photos.map((p) => (
        <li key={p.id} className={`rounded-xl border-2 bg-panel p-3 ${p.state === 'rejected' ? 'border-alarm' : 'border-line'}`} data-testid="outbox-photo">
          <p className="font-bold">📷 {Math.round(p.bytes / 1024)} KB</p>
          {p.state === 'rejected' ? (
            <>
              <p className="text-sm font-bold text-alarm">{t('outbox.photoRejected', { reason: p.error ?? '' })}</p>
              <Button type="button" variant="danger" className="mt-2" onClick={() => window.confirm(t('outbox.confirmDiscard')) && void removePhoto(p.id)}>
                {t('outbox.discard')}
              </Button>
            </>
          ) : (
            <p className="text-sm text-bark-soft">{t('outbox.queued')}</p>
          )}
        </li>
      ))}
    </ul>
  );
}
