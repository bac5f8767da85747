'use client';

import { useTranslations } from 'next-intl';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { useFieldSettings, useVineSpacing } from '@/components/field/field-settings';
import { budDeviationPercent, checkBudLoad, pruningCheckBuds } from '@/lib/viticulture';
import type { FormValues } from '@/lib/units/observation';
import { ChoiceField, CountField, NumberField, Reads, type FieldsProps } from './parts';

export function PruningRecordFields({ form, errors, imperial }: FieldsProps) {
  const t = useTranslations('form');
  const shared = { form, errors };
  return (
    <>
      <CountField {...shared} name="canesKept" label={t('canesKept')} />
      <CountField {...shared} name="budsPerCane" label={t('budsPerCane')} />
      <CountField {...shared} name="renewalSpurs" label={t('renewalSpurs')} />
      <NumberField {...shared} name="pruningWeightKg" label={t('pruningWeight')} unit={imperial ? 'lb' : 'kg'} />
      <Reads>
        <CountField {...shared} name="budTarget" label={t('budTarget')} />
        <BudLoadNote target={form.watch('budTarget')} />
      </Reads>
    </>
  );
}

export function PruningCheckFields({ form, errors }: FieldsProps) {
  const t = useTranslations('form');
  const shared = { form, errors };
  return (
    <>
      <CrewField {...shared} />
      <CountField {...shared} name="canesKept" label={t('canesKept')} />
      <CountField {...shared} name="budsOnCanes" label={t('budsOnCanes')} />
      <CountField {...shared} name="renewalSpurs" label={t('renewalSpurs')} />
      <Reads>
        <CountField {...shared} name="budTarget" label={t('budTargetBlock')} />
        <BudLoadNote target={form.watch('budTarget')} />
        <CheckFeedback values={form.watch()} />
      </Reads>
    </>
  );
}

function CrewField({ form, errors }: Omit<FieldsProps, 'imperial'>) {
  const t = useTranslations('form');
  const crew = useCrew();
  if (crew.isPending) return <p>{t('crewLoading')}</p>;
  if (!crew.data) return <p className="font-bold text-alarm">{t('crewMissing')}</p>;
  const pruners = crew.data.filter((m) => m.role === 'pruner');
  const options = (pruners.length ? pruners : crew.data.filter((m) => m.role !== 'advisor')).map((m) => ({ value: m.userId, label: memberLabel(m) }));
  return <ChoiceField form={form} errors={errors} name="prunedBy" label={t('prunedBy')} options={options} />;
}

/**
 * A bud target read against the row it fills (Ohio State, "2023 Grape Pruning Primer": about 4–6 buds
 * per foot of vine spacing): far outside it, the target is more likely a slip than the vine's load.
 */
function BudLoadNote({ target }: { target: unknown }) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  const spacing = useVineSpacing();
  if (!spacing || typeof target !== 'number' || !Number.isInteger(target) || target <= 0) return null;
  const load = checkBudLoad(target, spacing, settings);
  if (load.reading === 'within') return null;
  const { minBudsPerFt, maxBudsPerFt } = settings.budLoad;
  return (
    <p role="status" className="rounded-lg border-2 border-cut bg-cut-tint p-2 font-bold" data-testid="bud-load-note">
      {t(load.reading === 'over' ? 'budLoadOver' : 'budLoadUnder', {
        buds: target,
        perFt: Math.round(load.budsPerFt * 10) / 10,
        perM: Math.round(load.budsPerM * 10) / 10,
        min: load.rangePerVine.min,
        max: load.rangePerVine.max,
        lowFt: minBudsPerFt,
        highFt: maxBudsPerFt,
      })}
    </p>
  );
}

function CheckFeedback({ values }: { values: FormValues }) {
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
      {target && <p>{percent === 0 ? t('checkOnTarget', { target }) : t(percent > 0 ? 'checkAbove' : 'checkBelow', { percent: Math.abs(percent), target })}</p>}
    </div>
  );
}
