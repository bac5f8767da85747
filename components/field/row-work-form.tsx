'use client';

import { useTranslations } from 'next-intl';
import { useEffect, useRef, useState } from 'react';
import { Choice } from '@/components/field/choice';
import { FORM_BAR, useFormFit } from '@/components/field/use-form-fit';
import { Button } from '@/components/ui/button';
import { Field, Input } from '@/components/ui/field';
import { enqueueRowWork, readCrewDefaults, saveCrewDefaults } from '@/lib/offline/row-work';
import { ROW_WORK_PASSES, type RowWorkPass } from '@/lib/work/passes';

interface RowWorkFormProps {
  owner: string;
  blockId: string;
  row: number;
  vineCount: number;
  /** The pass the list is showing, when it shows one. */
  pass?: RowWorkPass;
  onSaved: (pass: RowWorkPass) => void;
  onCancel: () => void;
}

type Errors = Partial<Record<'pass' | 'crewSize' | 'personHours' | 'time' | 'run', string>>;

const hhmm = (d: Date) => `${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`;
const sameDay = (a: Date, b: Date) => a.toDateString() === b.toDateString();

/** Today's local time HH:MM as a moment. */
function todayAt(time: string): Date | undefined {
  if (!/^\d{2}:\d{2}$/.test(time)) return undefined;
  const [h, m] = time.split(':').map(Number);
  const d = new Date();
  d.setHours(h!, m!, 0, 0);
  return d;
}

/**
 * "Row done": the pass, the crew and its hours for one row (or a run of it), saved on the phone
 * first and sent through the outbox's "row-work" collection. The crew's last pass and size come
 * back for the next row, and the last row's finish becomes this row's start.
 */
export function RowWorkForm({ owner, blockId, row, vineCount, pass: shown, onSaved, onCancel }: RowWorkFormProps) {
  const t = useTranslations('work');
  const tForm = useTranslations('form');
  const [pass, setPass] = useState<RowWorkPass | undefined>(shown);
  const [crewSize, setCrewSize] = useState(1);
  const [start, setStart] = useState('');
  const [finish, setFinish] = useState(() => hhmm(new Date()));
  const [hours, setHours] = useState('');
  const [hoursEdited, setHoursEdited] = useState(false);
  const [part, setPart] = useState(false);
  const [from, setFrom] = useState('1');
  const [to, setTo] = useState(String(vineCount));
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Errors>({});
  const [saving, setSaving] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);
  const barRef = useRef<HTMLDivElement>(null);
  useFormFit(formRef, barRef);

  useEffect(() => {
    const last = readCrewDefaults(owner);
    if (!last) return;
    setPass((p) => p ?? last.pass);
    setCrewSize(last.crewSize);
    if (last.lastFinishedAt && sameDay(new Date(last.lastFinishedAt), new Date())) setStart(hhmm(new Date(last.lastFinishedAt)));
  }, [owner]);

  const started = todayAt(start);
  const finished = todayAt(finish);
  const worked = started && finished && finished > started ? (finished.getTime() - started.getTime()) / 3_600_000 : undefined;
  const computed = worked === undefined ? undefined : Math.round(crewSize * worked * 100) / 100;
  const shownHours = hoursEdited ? hours : computed === undefined ? hours : String(computed);

  async function save() {
    const problems: Errors = {};
    const personHours = Number(shownHours.replace(',', '.'));
    if (!pass) problems.pass = t('choosePass');
    if (!Number.isInteger(crewSize) || crewSize < 1) problems.crewSize = t('crewInvalid');
    if (!finished || (started && started > finished)) problems.time = t('timeInvalid');
    if (!(personHours > 0)) problems.personHours = t('hoursInvalid');
    const fromPosition = Number(from);
    const toPosition = Number(to);
    if (
      part &&
      !(Number.isInteger(fromPosition) && Number.isInteger(toPosition) && fromPosition >= 1 && toPosition >= fromPosition && toPosition <= vineCount)
    ) {
      problems.run = t('runInvalid', { max: vineCount });
    }
    setErrors(problems);
    if (Object.keys(problems).length) return;
    setSaving(true);
    try {
      const finishedAt = finished!.toISOString();
      await enqueueRowWork(owner, {
        id: crypto.randomUUID(),
        blockId,
        row,
        pass: pass!,
        ...(part ? { fromPosition, toPosition } : {}),
        crewSize,
        personHours,
        ...(started ? { startedAt: started.toISOString() } : {}),
        finishedAt,
        note: note.trim(),
      });
      saveCrewDefaults(owner, { pass: pass!, crewSize, lastFinishedAt: finishedAt });
      onSaved(pass!);
    } finally {
      setSaving(false);
    }
  }

  return (
    <form ref={formRef} onSubmit={(e) => e.preventDefault()} className="flex flex-col gap-4" noValidate aria-label={t('formTitle', { row })}>
      <h2 className="text-2xl font-extrabold">{t('formTitle', { row })}</h2>
      <Choice<RowWorkPass>
        label={t('pass')}
        value={pass}
        options={ROW_WORK_PASSES.map((p) => ({ value: p, label: t(`passes.${p}`) }))}
        onChange={setPass}
        error={errors.pass}
      />
      <Field id="rw-crew" label={t('crewSize')} error={errors.crewSize}>
        <div className="flex items-stretch gap-2">
          <button
            type="button"
            aria-label={t('crewLess')}
            onClick={() => setCrewSize((n) => Math.max(1, n - 1))}
            className="min-h-touch min-w-16 rounded-lg border-2 border-rootstock text-2xl font-extrabold text-rootstock"
          >
            −
          </button>
          <Input
            id="rw-crew"
            value={crewSize}
            inputMode="numeric"
            onChange={(e) => setCrewSize(Math.max(0, Math.floor(Number(e.target.value) || 0)))}
            className="w-20 text-center text-2xl font-extrabold"
          />
          <button
            type="button"
            aria-label={t('crewMore')}
            onClick={() => setCrewSize((n) => Math.min(200, n + 1))}
            className="min-h-touch min-w-16 rounded-lg border-2 border-rootstock text-2xl font-extrabold text-rootstock"
          >
            +
          </button>
        </div>
      </Field>
      <div className="grid grid-cols-2 gap-3">
        <Field id="rw-start" label={t('start')}>
          <Input id="rw-start" type="time" value={start} onChange={(e) => setStart(e.target.value)} className="text-xl" />
        </Field>
        <Field id="rw-finish" label={t('finish')} error={errors.time}>
          <Input id="rw-finish" type="time" value={finish} onChange={(e) => setFinish(e.target.value)} className="text-xl" />
        </Field>
      </div>
      <Field
        id="rw-hours"
        label={t('personHours')}
        error={errors.personHours}
        hint={computed !== undefined && !hoursEdited ? t('hoursFilled', { crew: crewSize }) : t('hoursHint')}
      >
        <Input
          id="rw-hours"
          value={shownHours}
          inputMode="decimal"
          onChange={(e) => {
            setHoursEdited(true);
            setHours(e.target.value);
          }}
          className="text-xl"
        />
      </Field>
      <label className="flex min-h-touch items-center gap-3 font-bold">
        <input type="checkbox" checked={part} onChange={(e) => setPart(e.target.checked)} className="size-7" />
        {t('partOfRow')}
      </label>
      {part && (
        <div className="grid grid-cols-2 gap-3">
          <Field id="rw-from" label={t('fromVine')} error={errors.run}>
            <Input id="rw-from" value={from} inputMode="numeric" onChange={(e) => setFrom(e.target.value)} />
          </Field>
          <Field id="rw-to" label={t('toVine', { max: vineCount })}>
            <Input id="rw-to" value={to} inputMode="numeric" onChange={(e) => setTo(e.target.value)} />
          </Field>
        </div>
      )}
      <Field id="rw-note" label={t('note')}>
        <textarea id="rw-note" value={note} onChange={(e) => setNote(e.target.value)} rows={2} className="rounded-lg border-2 border-line bg-panel p-3" />
      </Field>
      <div ref={barRef} data-sticky-bottom className={FORM_BAR}>
        <Button type="button" variant="secondary" onClick={onCancel} className="min-h-14 flex-1 text-lg">
          {tForm('cancel')}
        </Button>
        <Button type="button" onClick={() => void save()} disabled={saving} className="min-h-14 flex-1 text-lg">
          ✓ {t('save')}
        </Button>
      </div>
    </form>
  );
}
