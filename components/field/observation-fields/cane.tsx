'use client';

import { useTranslations } from 'next-intl';
import { useFieldSettings } from '@/components/field/field-settings';
import { formToRecord } from '@/lib/units/observation';
import { assessCane, caneReasonCode, recommendedBudsPerCane } from '@/lib/viticulture';
import { ChoiceField, NumberField, Reads, useChoices, type FieldsProps } from './parts';

/** Cane diameter and shade cane share the cane's measures; the diameter kind adds its shape and origin. */
function CaneFields({ form, errors, imperial, full }: FieldsProps & { full: boolean }) {
  const t = useTranslations('form');
  const { yesNo } = useChoices();
  const unit = imperial ? t('unitIn') : t('unitMm');
  const shared = { form, errors };
  return (
    <>
      <Reads>
        <NumberField {...shared} name="diameterMm" label={t('diameter')} unit={unit} hint={t('diameterHint')} />
        <CaneFeedback form={form} imperial={imperial} />
      </Reads>
      <NumberField {...shared} name="longestInternodeMm" label={t('internode')} unit={unit} />
      <ChoiceField
        {...shared}
        name="exposure"
        label={t('exposure')}
        options={[
          { value: 'sun', label: t('exposureSun') },
          { value: 'partial', label: t('exposurePartial') },
          { value: 'shade', label: t('exposureShade') },
        ]}
      />
      <ChoiceField {...shared} name="colourGood" label={t('colourGood')} options={yesNo} />
      {full && (
        <>
          <ChoiceField {...shared} name="flat" label={t('flat')} options={yesNo} />
          <ChoiceField
            {...shared}
            name="origin"
            label={t('origin')}
            options={[
              { value: 'two-year-wood', label: t('originTwoYear') },
              { value: 'older-wood', label: t('originOlder') },
              { value: 'trunk', label: t('originTrunk') },
            ]}
          />
          <ChoiceField {...shared} name="injured" label={t('injured')} options={yesNo} />
        </>
      )}
    </>
  );
}

export const CaneDiameterFields = (props: FieldsProps) => <CaneFields {...props} full />;
export const ShadeCaneFields = (props: FieldsProps) => <CaneFields {...props} full={false} />;

function CaneFeedback({ form, imperial }: Pick<FieldsProps, 'form' | 'imperial'>) {
  const t = useTranslations('feedback');
  const settings = useFieldSettings();
  const values = formToRecord(form.watch(), imperial ? 'imperial' : 'metric');
  const diameter = values.diameterMm;
  if (typeof diameter !== 'number' || !(diameter > 0) || diameter > 40) return null;
  const internode = typeof values.longestInternodeMm === 'number' && values.longestInternodeMm > 0 ? values.longestInternodeMm : undefined;
  const verdict = assessCane({ ...(values as object), baseDiameterMm: diameter, longestInternodeMm: internode } as Parameters<typeof assessCane>[0], settings);
  const buds = recommendedBudsPerCane(diameter, settings);
  const tone =
    verdict.verdict === 'fruit-cane'
      ? 'border-rootstock bg-rootstock-tint'
      : verdict.verdict === 'remove'
        ? 'border-alarm bg-alarm-tint'
        : 'border-cut bg-cut-tint';
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
