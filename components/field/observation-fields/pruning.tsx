'use client';

import { useTranslations } from 'next-intl';
import { memberLabel, useCrew } from '@/components/tasks/use-crew';
import { useFieldSettings } from '@/components/field/field-settings';
import { budDeviationPercent, pruningCheckBuds } from '@/lib/viticulture';
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
      <CountField {...shared} name="budTarget" label={t('budTarget')} />
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
