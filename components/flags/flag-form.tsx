'use client';

import { useTranslations } from 'next-intl';
import { useRef, useState } from 'react';
import { Choice } from '@/components/field/choice';
import { FORM_BAR, useFormFit } from '@/components/field/use-form-fit';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { enqueueRecord } from '@/lib/offline/outbox';
import { FLAG_REASONS, MAX_FLAG_RUN, type FlagReason } from '@/lib/validation/flag';

interface FlagFormProps {
  owner: string;
  blockId: string;
  row: number;
  position: number;
  /** The last vine of the row: a run cannot go past it. */
  lastPosition: number;
  onSaved: () => void;
  onCancel: () => void;
}

/**
 * Flags this vine, or a run of vines up the row, for extra care. Saved on the phone first like
 * every field record, and sent through the outbox's "flags" collection.
 */
export function FlagForm({ owner, blockId, row, position, lastPosition, onSaved, onCancel }: FlagFormProps) {
  const t = useTranslations('flag');
  const tForm = useTranslations('form');
  const [reason, setReason] = useState<FlagReason>();
  const [toPosition, setToPosition] = useState(position);
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Partial<Record<'reason' | 'toPosition' | 'note', string>>>({});
  const [saving, setSaving] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const barRef = useRef<HTMLDivElement>(null);
  useFormFit(formRef, barRef);
  const max = Math.min(lastPosition, position + MAX_FLAG_RUN - 1);

  async function save() {
    const problems: typeof errors = {};
    if (!reason) problems.reason = t('chooseReason');
    if (!Number.isInteger(toPosition) || toPosition < position || toPosition > max) problems.toPosition = t('runInvalid', { from: position, max });
    if (reason === 'other' && !note.trim()) problems.note = t('noteRequired');
    setErrors(problems);
    if (Object.keys(problems).length) return;
    setSaving(true);
    try {
      await enqueueRecord(owner, 'flags', {
        id: crypto.randomUUID(),
        blockId,
        row,
        position,
        ...(toPosition > position ? { toPosition } : {}),
        reason: reason!,
        note: note.trim(),
        flaggedAt: new Date().toISOString(),
      });
      onSaved();
    } finally {
      setSaving(false);
    }
  }

  const step = (delta: number) => setToPosition((p) => Math.max(position, Math.min(max, p + delta)));

  return (
    <form ref={formRef} onSubmit={(e) => e.preventDefault()} className="flex flex-col gap-4" noValidate aria-label={t('title')}>
      <h2 className="text-2xl font-extrabold">{t('title')}</h2>
      <Choice<FlagReason>
        label={t('reason')}
        value={reason}
        options={FLAG_REASONS.map((r) => ({ value: r, label: t(`reasons.${r}`) }))}
        onChange={setReason}
        error={errors.reason}
      />
      <Field id="flag-to" label={t('run')} error={errors.toPosition} hint={t('runHint', { row, position })}>
        <div className="flex items-stretch gap-2">
          <button
            type="button"
            aria-label="−1"
            onClick={() => step(-1)}
            className="min-h-touch min-w-16 rounded-lg border-2 border-rootstock text-2xl font-extrabold text-rootstock"
          >
            −
          </button>
          <input
            id="flag-to"
            value={toPosition}
            onChange={(e) => setToPosition(Number(e.target.value))}
            inputMode="numeric"
            pattern="[0-9]*"
            className="min-h-touch w-full rounded-lg border-2 border-line bg-panel px-3 text-center text-xl font-bold"
          />
          <button
            type="button"
            aria-label="+1"
            onClick={() => step(1)}
            className="min-h-touch min-w-16 rounded-lg border-2 border-rootstock text-2xl font-extrabold text-rootstock"
          >
            +
          </button>
        </div>
      </Field>
      <Field id="flag-note" label={t('note')} error={errors.note}>
        <textarea
          id="flag-note"
          value={note}
          onChange={(e) => setNote(e.target.value)}
          rows={2}
          maxLength={2000}
          className="rounded-lg border-2 border-line bg-panel p-2"
        />
      </Field>
      <div ref={barRef} data-sticky-bottom className={FORM_BAR}>
        <Button type="button" variant="quiet" className="flex-none px-2" onClick={onCancel}>
          {tForm('cancel')}
        </Button>
        <Button type="button" className="min-h-14 flex-1" disabled={saving} onClick={() => void save()}>
          {t('save')}
        </Button>
      </div>
    </form>
  );
}
