'use client';

import { useTranslations } from 'next-intl';
import { CANE_INJURY_CAUSES, TRUNK_INJURY_CAUSES } from '@/lib/viticulture';
import { ChoiceField, CountField, useChoices, type FieldsProps } from './parts';

export function TrunkInjuryFields({ form, errors }: FieldsProps) {
  const t = useTranslations('form');
  const { severities } = useChoices();
  return (
    <>
      <ChoiceField
        form={form}
        errors={errors}
        name="cause"
        label={t('cause')}
        options={TRUNK_INJURY_CAUSES.map((c) => ({ value: c, label: t(`causes.${c}`) }))}
      />
      <ChoiceField form={form} errors={errors} name="severity" label={t('severity')} options={severities} />
      <CountField form={form} errors={errors} name="girdlingPercent" label={t('girdling')} />
    </>
  );
}

export function CaneInjuryFields({ form, errors }: FieldsProps) {
  const t = useTranslations('form');
  const { severities } = useChoices();
  return (
    <>
      <ChoiceField
        form={form}
        errors={errors}
        name="cause"
        label={t('cause')}
        options={CANE_INJURY_CAUSES.map((c) => ({ value: c, label: t(`causes.${c}`) }))}
      />
      <CountField form={form} errors={errors} name="canesAffected" label={t('canesAffected')} />
      <ChoiceField form={form} errors={errors} name="severity" label={t('severity')} options={severities} />
    </>
  );
}

export function MissingVineFields({ form, errors }: FieldsProps) {
  const t = useTranslations('form');
  return (
    <ChoiceField
      form={form}
      errors={errors}
      name="state"
      label={t('state')}
      options={[
        { value: 'missing', label: t('stateMissing') },
        { value: 'dead', label: t('stateDead') },
        { value: 'dying', label: t('stateDying') },
      ]}
    />
  );
}

/** A note is the note field alone, which every form has. */
export function NoteFields() {
  return null;
}
