'use client';

import { useTranslations } from 'next-intl';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { KIND_FIELDS } from '@/components/field/observation-fields';
import { FORM_BAR, useFormFit } from '@/components/field/use-form-fit';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { downscalePhoto } from '@/lib/offline/resize';
import { LOCAL } from '@/lib/device-keys';
import { formToRecord, recordToForm, type FormValues } from '@/lib/units/observation';
import { observationDataSchemas } from '@/lib/validation/observation';
import type { ObservationKind } from '@/lib/viticulture';

export interface PhotoDraft {
  id: string;
  blob: Blob;
  url: string;
}

export interface SavedObservation {
  data: Record<string, unknown>;
  note: string;
  photos: PhotoDraft[];
}

export function ObservationForm({
  kind,
  imperial,
  initial,
  onSave,
  onCancel,
  allowNext = true,
}: {
  kind: ObservationKind;
  imperial: boolean;
  initial?: { data: Record<string, unknown>; note: string };
  onSave: (saved: SavedObservation, next: boolean) => Promise<void>;
  onCancel: () => void;
  allowNext?: boolean;
}) {
  const t = useTranslations();
  const system = imperial ? 'imperial' : 'metric';
  const form = useForm<FormValues>({ defaultValues: initial ? recordToForm(initial.data, system) : {} });
  const formRef = useRef<HTMLFormElement>(null);
  const barRef = useRef<HTMLDivElement>(null);
  useFormFit(formRef, barRef);
  const [note, setNote] = useState(initial?.note ?? '');
  const [photos, setPhotos] = useState<PhotoDraft[]>([]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saving, setSaving] = useState(false);
  // Photos still being downscaled: saving before they are ready would drop them, or pin them on the next vine.
  const [preparing, setPreparing] = useState(0);
  const [photoError, setPhotoError] = useState<string>();
  const [last, setLast] = useState<FormValues>();
  const Fields = KIND_FIELDS[kind];

  useEffect(() => {
    const stored = localStorage.getItem(LOCAL.lastValues(kind));
    if (stored) setLast(JSON.parse(stored) as FormValues);
  }, [kind]);
  useEffect(() => () => photos.forEach((p) => URL.revokeObjectURL(p.url)), [photos]);

  const submit = (next: boolean) =>
    form.handleSubmit(async (raw) => {
      const data = formToRecord(raw, system);
      const parsed = observationDataSchemas[kind].safeParse(data);
      if (!parsed.success) {
        setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? '_'), i.message])));
        return;
      }
      setErrors({});
      setSaving(true);
      try {
        localStorage.setItem(LOCAL.lastValues(kind), JSON.stringify(raw));
        await onSave({ data: parsed.data as Record<string, unknown>, note: note.trim(), photos }, next);
      } finally {
        setSaving(false);
      }
    })();

  const addPhotos = async (files: FileList | null) => {
    const chosen = Array.from(files ?? []);
    setPhotoError(undefined);
    setPreparing((n) => n + chosen.length);
    for (const file of chosen) {
      try {
        const { blob } = await downscalePhoto(file);
        setPhotos((p) => [...p, { id: crypto.randomUUID(), blob, url: URL.createObjectURL(blob) }]);
      } catch {
        setPhotoError(t('form.photoFailed', { name: file.name }));
      } finally {
        setPreparing((n) => n - 1);
      }
    }
  };
  const busy = saving || preparing > 0;

  return (
    <form ref={formRef} onSubmit={(e) => e.preventDefault()} className="flex flex-col gap-4" noValidate aria-label={t(`kinds.${kind}`)}>
      <div className="flex items-center justify-between gap-2">
        <h2 className="text-2xl font-extrabold">{t(`kinds.${kind}`)}</h2>
        {last && (
          <button type="button" className="min-h-touch rounded-lg border-2 border-line px-3 font-bold" onClick={() => form.reset(last)}>
            {t('form.sameAsLast')}
          </button>
        )}
      </div>

      <Fields form={form} errors={errors} imperial={imperial} />

      <Field id="f-note" label={t('form.note')} error={errors.note}>
        <textarea
          id="f-note"
          value={note}
          onChange={(e) => setNote(e.target.value)}
          rows={2}
          maxLength={2000}
          className="rounded-lg border-2 border-line bg-panel p-2"
        />
      </Field>

      <div className="flex flex-col gap-2">
        <label className="flex min-h-touch cursor-pointer items-center justify-center rounded-lg border-2 border-dashed border-rootstock font-bold text-rootstock">
          📷 {t('form.takePhoto')}
          <input
            type="file"
            accept="image/*"
            capture="environment"
            multiple
            className="sr-only"
            data-testid="photo-input"
            onChange={(e) => void addPhotos(e.target.files)}
          />
        </label>
        <p className="text-sm text-bark-soft" data-testid="photo-count" role="status">
          {preparing > 0 ? t('form.preparingPhotos', { count: preparing }) : t('form.photoCount', { count: photos.length })}
        </p>
        {photoError && (
          <p className="text-sm font-bold text-alarm" role="alert">
            {photoError}
          </p>
        )}
        {photos.length > 0 && (
          <ul className="grid grid-cols-3 gap-2">
            {photos.map((p) => (
              <li key={p.id} className="relative">
                <img src={p.url} alt="" className="aspect-square w-full rounded-lg object-cover" />
                <button
                  type="button"
                  aria-label={t('form.removePhoto')}
                  className="absolute right-1 top-1 size-10 rounded-full bg-bark/80 font-bold text-white"
                  onClick={() => setPhotos((all) => all.filter((x) => x.id !== p.id))}
                >
                  ✕
                </button>
              </li>
            ))}
          </ul>
        )}
      </div>

      {/* One compact row, so more of the form shows; use-form-fit lifts it over the keyboard. */}
      <div ref={barRef} data-sticky-bottom className={FORM_BAR}>
        <Button type="button" variant="quiet" className="flex-none px-2" onClick={onCancel}>
          {t('form.cancel')}
        </Button>
        <Button
          type="button"
          variant={allowNext ? 'secondary' : 'primary'}
          className="min-h-14 flex-1 px-2 leading-tight"
          disabled={busy}
          onClick={() => void submit(false)}
        >
          {t('form.save')}
        </Button>
        {allowNext && (
          <Button type="button" className="min-h-14 flex-[1.6] px-2 leading-tight" disabled={busy} onClick={() => void submit(true)}>
            {t('form.saveNext')}
          </Button>
        )}
      </div>
    </form>
  );
}
