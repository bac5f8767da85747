'use client';

import { useTranslations } from 'next-intl';
import { useFieldSettings } from '@/components/field/field-settings';
import { budbreakPercent, budInjuryAdjustment, isWeakBudbreak, primaryBudKillPercent } from '@/lib/viticulture';
import { CountField, Reads, type FieldsProps } from './parts';

export function WeakBudbreakFields({ form, errors }: FieldsProps) {
  const t = useTranslations('form');
  return (
    <>
      <CountField form={form} errors={errors} name="budsRetained" label={t('budsRetained')} />
      <Reads>
        <CountField form={form} errors={errors} name="budsPushed" label={t('budsPushed')} />
        <BudbreakFeedback retained={form.watch('budsRetained')} pushed={form.watch('budsPushed')} />
      </Reads>
    </>
  );
}

export function BudInjuryFields({ form, errors }: FieldsProps) {
  const t = useTranslations('form');
  return (
    <>
      <CountField form={form} errors={errors} name="budsCut" label={t('budsCut')} />
      <Reads>
        <CountField form={form} errors={errors} name="primariesDead" label={t('primariesDead')} />
        <BudInjuryFeedback cut={form.watch('budsCut')} dead={form.watch('primariesDead')} />
      </Reads>
    </>
  );
}

function BudbreakFeedback({ retained, pushed }: { retained: unknown; pushed: unknown }) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  if (typeof retained !== 'number' || typeof pushed !== 'number' || !(retained > 0) || pushed < 0 || pushed > retained) return null;
  const weak = isWeakBudbreak(retained, pushed, settings);
  return (
    <div
      className={`rounded-lg border-2 p-3 ${weak ? 'border-cut bg-cut-tint' : 'border-rootstock bg-rootstock-tint'}`}
      aria-live="polite"
      data-testid="budbreak-feedback"
    >
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
    <div className="rounded-lg border-2 border-cut bg-cut-tint p-3" aria-live="polite" data-testid="bud-injury-feedback">
      <p className="text-lg font-extrabold">{t('kill', { percent: Math.round(percent) })}</p>
      <p>{t(`advice.${advice}`, { percent: Math.round(percent) })}</p>
    </div>
  );
}
