'use client';

import { useQueryClient } from '@tanstack/react-query';
import { useTranslations } from 'next-intl';
import { useEffect, useState } from 'react';
import { addressKey, markDoneInCopy, useQueuedDone, type PhoneTask } from '@/components/tasks/use-my-tasks';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { enqueueObservation, enqueuePhoto, enqueueRecord } from '@/lib/offline/outbox';
import { downscalePhoto } from '@/lib/offline/resize';
import { requestBackgroundSync, syncNow } from '@/lib/offline/sync';
import type { FlagReason } from '@/lib/validation/flag';

interface TaskStepProps {
  owner: string;
  task: PhoneTask;
  row: number;
  position: number;
  /** Called after a vine is marked done, to move on to the next vine still to do. */
  onDone: () => void;
}

/**
 * The task part of the vine stepper: which vine of the task this is, why it is in the task, and
 * "mark done" with an optional note and photo. The photo hangs on a note observation of the vine
 * (photos only ever belong to observations); the task update names it, and the outbox sends
 * observations before task updates.
 */
export function TaskStep({ owner, task, row, position, onDone }: TaskStepProps) {
  const t = useTranslations();
  const queryClient = useQueryClient();
  const queued = useQueuedDone(task.id);
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState('');
  const [photo, setPhoto] = useState<{ blob: Blob; url: string }>();
  const [saving, setSaving] = useState(false);
  // A photo still being downscaled: marking done before it is ready would leave it off, or pin it on the next vine.
  const [preparing, setPreparing] = useState(false);
  const [photoError, setPhotoError] = useState<string>();
  useEffect(() => () => photo && URL.revokeObjectURL(photo.url), [photo]);
  useEffect(() => {
    setOpen(false);
    setNote('');
    setPhoto(undefined);
    setPhotoError(undefined);
  }, [row, position]);

  const index = task.items.findIndex((i) => i.row === row && i.position === position);
  const item = task.items[index];
  if (!item) return null;
  const waiting = queued.has(addressKey(row, position));
  const finished = task.items.every((i) => i.status === 'done' || queued.has(addressKey(i.row, i.position)));
  const done = item.status === 'done';
  const reasons = [...new Set(item.flags.map((f) => t(`flag.reasons.${f.reason as FlagReason}`)))].join(', ');
  const notes = item.flags.map((f) => f.note).filter(Boolean);

  async function save() {
    setSaving(true);
    try {
      const now = new Date().toISOString();
      let observationId: string | undefined;
      if (photo) {
        observationId = crypto.randomUUID();
        await enqueueObservation(owner, {
          id: observationId,
          blockId: task.blockId,
          row,
          position,
          kind: 'note',
          data: {},
          note: `${t('tasks.photoNote', { title: task.title })}${note.trim() ? `: ${note.trim()}` : ''}`.slice(0, 2000),
          observedAt: now,
        });
        await enqueuePhoto({
          id: crypto.randomUUID(),
          owner,
          observationId,
          blob: photo.blob,
          contentType: 'image/jpeg',
          bytes: photo.blob.size,
          takenAt: now,
        });
      }
      await enqueueRecord(owner, 'task-updates', {
        id: crypto.randomUUID(),
        taskId: task.id,
        blockId: task.blockId,
        row,
        position,
        note: note.trim(),
        ...(observationId ? { observationId } : {}),
        doneAt: now,
      });
      await markDoneInCopy(owner, task.id, row, position);
      queryClient.setQueryData<{ tasks: PhoneTask[] }>(
        ['my-tasks', owner],
        (old) =>
          old && {
            ...old,
            tasks: old.tasks.map((x) =>
              x.id !== task.id ? x : { ...x, items: x.items.map((i) => (i.row === row && i.position === position ? { ...i, status: 'done' as const } : i)) },
            ),
          },
      );
      void syncNow();
      void requestBackgroundSync();
      onDone();
    } finally {
      setSaving(false);
    }
  }

  return (
    <section className="flex flex-col gap-2 rounded-xl border-4 border-rootstock bg-rootstock-tint p-3" aria-label={task.title} data-testid="task-step">
      <p className="font-bold">{t('tasks.step', { index: index + 1, total: task.items.length, title: task.title })}</p>
      {reasons && <p className="text-lg font-extrabold">{t('tasks.why', { reasons })}</p>}
      {notes.map((n) => (
        <p key={n} className="italic">
          “{n}”
        </p>
      ))}
      {done || waiting ? (
        <>
          <p role="status" className="text-lg font-extrabold text-rootstock" data-testid="task-vine-done">
            ✓ {waiting && !done ? t('tasks.waiting') : t('tasks.doneHere')}
          </p>
          {finished && (
            <p className="font-bold">
              {t('tasks.allDone')}{' '}
              <a href="/field/tasks" className="underline">
                {t('tasks.back')}
              </a>
            </p>
          )}
        </>
      ) : open ? (
        <div className="flex flex-col gap-3">
          <Field id="task-note" label={t('tasks.doneNote')}>
            <textarea
              id="task-note"
              value={note}
              onChange={(e) => setNote(e.target.value)}
              rows={2}
              maxLength={1900}
              className="rounded-lg border-2 border-line bg-panel p-2"
            />
          </Field>
          <label className="flex min-h-touch cursor-pointer items-center justify-center rounded-lg border-2 border-dashed border-rootstock bg-panel font-bold text-rootstock">
            📷 {t('form.takePhoto')}
            <input
              type="file"
              accept="image/*"
              capture="environment"
              className="sr-only"
              data-testid="task-photo-input"
              onChange={(e) => {
                const file = e.target.files?.[0];
                if (!file) return;
                setPhotoError(undefined);
                setPreparing(true);
                downscalePhoto(file)
                  .then(({ blob }) => setPhoto({ blob, url: URL.createObjectURL(blob) }))
                  .catch(() => setPhotoError(t('form.photoFailed', { name: file.name })))
                  .finally(() => setPreparing(false));
              }}
            />
          </label>
          {preparing && (
            <p className="text-sm text-bark-soft" role="status">
              {t('form.preparingPhotos', { count: 1 })}
            </p>
          )}
          {photoError && (
            <p className="text-sm font-bold text-alarm" role="alert">
              {photoError}
            </p>
          )}
          {photo && <img src={photo.url} alt="" className="max-h-40 self-start rounded-lg" />}
          <Button type="button" size="large" disabled={saving || preparing} onClick={() => void save()}>
            {t('tasks.saveDone')}
          </Button>
          <Button type="button" variant="quiet" onClick={() => setOpen(false)}>
            {t('form.cancel')}
          </Button>
        </div>
      ) : (
        <Button type="button" size="large" onClick={() => setOpen(true)}>
          ✓ {t('tasks.markDone')}
        </Button>
      )}
    </section>
  );
}
