'use client';

import { useTranslations } from 'next-intl';
import { useEffect, useState } from 'react';
import { Controller, useForm, type Control } from 'react-hook-form';
import { Choice } from '@/components/field/choice';
import { useFieldSettings } from '@/components/field/field-settings';
import { Button } from '@/components/ui/button';
import { Field, Input } from '@/components/ui/field';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { downscalePhoto } from '@/lib/offline/resize';
import { observationDataSchemas } from '@/lib/validation/observation';
import {
  assessCane,
  budbreakPercent,
  budDeviationPercent,
  budInjuryAdjustment,
  CANE_INJURY_CAUSES,
  caneReasonCode,
  inToMm,
  isWeakBudbreak,
  lbToKg,
  mmToIn,
  kgToLb,
  primaryBudKillPercent,
  pruningCheckBuds,
  recommendedBudsPerCane,
  TRUNK_INJURY_CAUSES,
  type ObservationKind,
} from '@/lib/viticulture';

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

type Values = Record<string, string | number | boolean | undefined>;

const LENGTH_FIELDS = ['diameterMm', 'longestInternodeMm'];
const WEIGHT_FIELDS = ['pruningWeightKg'];

/** Form values are in the organisation's units; the record is always metric. */
function toRecordData(values: Values, imperial: boolean) {
  const data: Record<string, unknown> = {};
  for (const [key, raw] of Object.entries(values)) {
    if (raw === undefined || raw === '' || (typeof raw === 'number' && Number.isNaN(raw))) continue;
    let value = raw;
    if (imperial && typeof raw === 'number' && LENGTH_FIELDS.includes(key)) value = Math.round(inToMm(raw) * 100) / 100;
    if (imperial && typeof raw === 'number' && WEIGHT_FIELDS.includes(key)) value = Math.round(lbToKg(raw) * 1000) / 1000;
    data[key] = value;
  }
  return data;
}

function toFormValues(data: Record<string, unknown>, imperial: boolean): Values {
  const values: Values = {};
  for (const [key, raw] of Object.entries(data)) {
    let value = raw as Values[string];
    if (imperial && typeof raw === 'number' && LENGTH_FIELDS.includes(key)) value = Math.round(mmToIn(raw) * 1000) / 1000;
    if (imperial && typeof raw === 'number' && WEIGHT_FIELDS.includes(key)) value = Math.round(kgToLb(raw) * 100) / 100;
    values[key] = value;
  }
  return values;
}

const lastKey = (kind: string) => `vineward-last-${kind}`;

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
  const form = useForm<Values>({ defaultValues: initial ? toFormValues(initial.data, imperial) : {} });
  const [note, setNote] = useState(initial?.note ?? '');
  const [photos, setPhotos] = useState<PhotoDraft[]>([]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saving, setSaving] = useState(false);
  const [last, setLast] = useState<Values>();
  const values = form.watch();
  const unitLength = imperial ? t('form.unitIn') : t('form.unitMm');

  useEffect(() => {
    const stored = localStorage.getItem(lastKey(kind));
    if (stored) setLast(JSON.parse(stored) as Values);
  }, [kind]);
  useEffect(() => () => photos.forEach((p) => URL.revokeObjectURL(p.url)), [photos]);

  const submit = (next: boolean) =>
    form.handleSubmit(async (raw) => {
      const data = toRecordData(raw, imperial);
      const parsed = observationDataSchemas[kind].safeParse(data);
      if (!parsed.success) {
        setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? '_'), i.message])));
        return;
      }
      setErrors({});
      setSaving(true);
      try {
        localStorage.setItem(lastKey(kind), JSON.stringify(raw));
        await onSave({ data: parsed.data as Record<string, unknown>, note: note.trim(), photos }, next);
      } finally {
        setSaving(false);
      }
    })();

  const addPhotos = async (files: FileList | null) => {
    for (const file of Array.from(files ?? [])) {
      const { blob } = await downscalePhoto(file);
      setPhotos((p) => [...p, { id: crypto.randomUUID(), blob, url: URL.createObjectURL(blob) }]);
    }
  };

  const num = (name: string, label: string, unit?: string, hint?: string, step = 'any') => (
    <Field id={`f-${name}`} label={unit ? `${label} (${unit})` : label} error={errors[name]} hint={hint}>
      <Input id={`f-${name}`} type="number" inputMode="decimal" step={step} {...form.register(name, { setValueAs: (v) => (v === '' ? undefined : Number(v)) })} />
    </Field>
  );
  const choice = (name: string, label: string, options: { value: string | boolean; label: string }[]) => (
    <ChoiceField control={form.control} name={name} label={label} options={options} error={errors[name]} />
  );
  const yesNo = [
    { value: true, label: t('form.yes') },
    { value: false, label: t('form.no') },
  ];
  const severities = (['light', 'moderate', 'severe'] as const).map((s) => ({ value: s, label: t(`form.${s}`) }));
  const exposures = [
    { value: 'sun', label: t('form.exposureSun') },
    { value: 'partial', label: t('form.exposurePartial') },
    { value: 'shade', label: t('form.exposureShade') },
  ];

  return (
    <form onSubmit={(e) => e.preventDefault()} className="flex flex-col gap-4" noValidate aria-label={t(`kinds.${kind}`)}>
      <div className="flex items-center justify-between gap-2">
        <h2 className="text-2xl font-extrabold">{t(`kinds.${kind}`)}</h2>
        {last && (
          <button type="button" className="min-h-touch rounded-lg border-2 border-line px-3 font-bold" onClick={() => form.reset(last)}>
            {t('form.sameAsLast')}
          </button>
        )}
      </div>

      {(kind === 'cane-diameter' || kind === 'shade-cane') && (
        <>
          {num('diameterMm', t('form.diameter'), unitLength, t('form.diameterHint'))}
          {num('longestInternodeMm', t('form.internode'), unitLength)}
          {choice('exposure', t('form.exposure'), exposures)}
          {choice('colourGood', t('form.colourGood'), yesNo)}
          {kind === 'cane-diameter' && (
            <>
              {choice('flat', t('form.flat'), yesNo)}
              {choice('origin', t('form.origin'), [
                { value: 'two-year-wood', label: t('form.originTwoYear') },
                { value: 'older-wood', label: t('form.originOlder') },
                { value: 'trunk', label: t('form.originTrunk') },
              ])}
              {choice('injured', t('form.injured'), yesNo)}
            </>
          )}
          <CaneFeedback values={toRecordData(values, imperial)} />
        </>
      )}
      {kind === 'weak-budbreak' && (
        <>
          {num('budsRetained', t('form.budsRetained'), undefined, undefined, '1')}
          {num('budsPushed', t('form.budsPushed'), undefined, undefined, '1')}
          <BudbreakFeedback retained={values.budsRetained} pushed={values.budsPushed} />
        </>
      )}
      {kind === 'trunk-injury' && (
        <>
          {choice('cause', t('form.cause'), TRUNK_INJURY_CAUSES.map((c) => ({ value: c, label: t(`form.causes.${c}`) })))}
          {choice('severity', t('form.severity'), severities)}
          {num('girdlingPercent', t('form.girdling'), undefined, undefined, '1')}
        </>
      )}
      {kind === 'cane-injury' && (
        <>
          {choice('cause', t('form.cause'), CANE_INJURY_CAUSES.map((c) => ({ value: c, label: t(`form.causes.${c}`) })))}
          {num('canesAffected', t('form.canesAffected'), undefined, undefined, '1')}
          {choice('severity', t('form.severity'), severities)}
        </>
      )}
      {kind === 'missing-vine' &&
        choice('state', t('form.state'), [
          { value: 'missing', label: t('form.stateMissing') },
          { value: 'dead', label: t('form.stateDead') },
          { value: 'dying', label: t('form.stateDying') },
        ])}
      {kind === 'bud-injury' && (
        <>
          {num('budsCut', t('form.budsCut'), undefined, undefined, '1')}
          {num('primariesDead', t('form.primariesDead'), undefined, undefined, '1')}
          <BudInjuryFeedback cut={values.budsCut} dead={values.primariesDead} />
        </>
      )}
      {kind === 'pruning-record' && (
        <>
          {num('canesKept', t('form.canesKept'), undefined, undefined, '1')}
          {num('budsPerCane', t('form.budsPerCane'), undefined, undefined, '1')}
          {num('renewalSpurs', t('form.renewalSpurs'), undefined, undefined, '1')}
          {num('pruningWeightKg', t('form.pruningWeight'), imperial ? 'lb' : 'kg')}
          {num('budTarget', t('form.budTarget'), undefined, undefined, '1')}
        </>
      )}
      {kind === 'pruning-check' && (
        <>
          <CrewField control={form.control} error={errors.prunedBy} />
          {num('canesKept', t('form.canesKept'), undefined, undefined, '1')}
          {num('budsOnCanes', t('form.budsOnCanes'), undefined, undefined, '1')}
          {num('renewalSpurs', t('form.renewalSpurs'), undefined, undefined, '1')}
          {num('budTarget', t('form.budTargetBlock'), undefined, undefined, '1')}
          <CheckFeedback values={values} />
        </>
      )}

      <Field id="f-note" label={t('form.note')} error={errors.note}>
        <textarea id="f-note" value={note} onChange={(e) => setNote(e.target.value)} rows={2} maxLength={2000} className="rounded-lg border-2 border-line bg-panel p-2" />
      </Field>

      <div className="flex flex-col gap-2">
        <label className="flex min-h-touch cursor-pointer items-center justify-center rounded-lg border-2 border-dashed border-rootstock font-bold text-rootstock">
          📷 {t('form.takePhoto')}
          <input type="file" accept="image/*" capture="environment" multiple className="sr-only" data-testid="photo-input" onChange={(e) => void addPhotos(e.target.files)} />
        </label>
        <p className="text-sm text-bark-soft" data-testid="photo-count">
          {t('form.photoCount', { count: photos.length })}
        </p>
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

      <div className="sticky bottom-0 flex flex-col gap-2 bg-ground py-2">
        {allowNext && (
          <Button type="button" size="large" disabled={saving} onClick={() => void submit(true)}>
            {t('form.saveNext')}
          </Button>
        )}
        <Button type="button" variant={allowNext ? 'secondary' : 'primary'} size="large" disabled={saving} onClick={() => void submit(false)}>
          {t('form.save')}
        </Button>
        <Button type="button" variant="quiet" onClick={onCancel}>
          {t('form.cancel')}
        </Button>
      </div>
    </form>
  );
}

function ChoiceField({
  control,
  name,
  label,
  options,
  error,
}: {
  control: Control<Values>;
  name: string;
  label: string;
  options: { value: string | boolean; label: string }[];
  error?: string;
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <Choice<string | boolean> label={label} value={field.value as string | boolean | undefined} options={options} onChange={field.onChange} error={error} />
      )}
    />
  );
}

function CrewField({ control, error }: { control: Control<Values>; error?: string }) {
  const t = useTranslations('form');
  const crew = useCrew();
  if (crew.isPending) return <p>{t('crewLoading')}</p>;
  if (!crew.data) return <p className="font-bold text-alarm">{t('crewMissing')}</p>;
  const pruners = crew.data.filter((m) => m.role === 'pruner');
  const options = (pruners.length ? pruners : crew.data.filter((m) => m.role !== 'advisor')).map((m) => ({ value: m.userId, label: memberLabel(m) }));
  return <ChoiceField control={control} name="prunedBy" label={t('prunedBy')} options={options} error={error} />;
}

function CheckFeedback({ values }: { values: Values }) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  const { canesKept, budsOnCanes, renewalSpurs, budTarget } = values;
  const counts = [canesKept, budsOnCanes, renewalSpurs];
  if (!counts.every((n) => typeof n === 'number' && Number.isInteger(n) && n >= 0)) return null;
  const left = pruningCheckBuds({ canesKept: canesKept as number, budsOnCanes: budsOnCanes as number, renewalSpurs: renewalSpurs as number }, settings);
  const target = typeof budTarget === 'number' && Number.isInteger(budTarget) && budTarget > 0 ? budTarget : undefined;
  const percent = target ? Math.round(budDeviationPercent(left, target)) : 0;
  return (
    <div
      className={`rounded-lg border-2 p-3 ${Math.abs(percent) > settings.pruningRecord.fineWithinPercent ? 'border-cut bg-cut-tint' : 'border-rootstock bg-rootstock-tint'}`}
      aria-live="polite"
      data-testid="check-feedback"
    >
      <p className="text-lg font-extrabold">{t('checkLeft', { left })}</p>
      {target && (
        <p>{percent === 0 ? t('checkOnTarget', { target }) : t(percent > 0 ? 'checkAbove' : 'checkBelow', { percent: Math.abs(percent), target })}</p>
      )}
    </div>
  );
}

function CaneFeedback({ values }: { values: Record<string, unknown> }) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  const diameter = values.diameterMm;
  if (typeof diameter !== 'number' || !(diameter > 0) || diameter > 40) return null;
  const internode = typeof values.longestInternodeMm === 'number' && values.longestInternodeMm > 0 ? values.longestInternodeMm : undefined;
  const verdict = assessCane({ ...(values as object), baseDiameterMm: diameter, longestInternodeMm: internode } as Parameters<typeof assessCane>[0], settings);
  const buds = recommendedBudsPerCane(diameter, settings);
  const tone = verdict.verdict === 'fruit-cane' ? 'border-rootstock bg-rootstock-tint' : verdict.verdict === 'remove' ? 'border-alarm bg-alarm-tint' : 'border-cut bg-cut-tint';
  return (
    <div className={`rounded-lg border-2 p-3 ${tone}`} aria-live="polite" data-testid="cane-feedback">
      <p className="text-lg font-extrabold">{t(`verdict.${verdict.verdict}`)}</p>
      {verdict.verdict !== 'remove' && <p>{t('buds', { min: buds.min, max: buds.max })}</p>}
      <ul className="list-disc pl-5 text-sm">
        {verdict.reasons.map((r) => {
          const code = caneReasonCode(r);
          return <li key={r}>{code ? t(`reasons.${code}`) : r}</li>;
        })}
      </ul>
    </div>
  );
}

function BudbreakFeedback({ retained, pushed }: { retained: unknown; pushed: unknown }) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  if (typeof retained !== 'number' || typeof pushed !== 'number' || !(retained > 0) || pushed < 0 || pushed > retained) return null;
  const weak = isWeakBudbreak(retained, pushed, settings);
  return (
    <div className={`rounded-lg border-2 p-3 ${weak ? 'border-cut bg-cut-tint' : 'border-rootstock bg-rootstock-tint'}`} aria-live="polite" data-testid="budbreak-feedback">
      <p className="text-lg font-extrabold">{t('budbreak', { percent: Math.round(budbreakPercent(retained, pushed)) })}</p>
      <p>{weak ? t('weak') : t('notWeak')}</p>
    </div>
  );
}

function BudInjuryFeedback({ cut, dead }: { cut: unknown; dead: unknown }) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  if (typeof cut !== 'number' || typeof dead !== 'number' || !(cut > 0) || dead < 0 || dead > cut) return null;
  const percent = primaryBudKillPercent(cut, dead);
  const { advice } = budInjuryAdjustment(100, percent, settings);
  return (
    <div className="rounded-lg border-2 border-cut bg-cut-tint p-3" aria-live="polite">
      <p className="text-lg font-extrabold">{t('kill', { percent: Math.round(percent) })}</p>
      <p>{t(`advice.${advice}`, { percent: Math.round(percent) })}</p>
    </div>
  );
}
