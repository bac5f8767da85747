'use client';

import { useTranslations } from 'next-intl';
import type { ReactNode } from 'react';
import { Controller, type UseFormReturn } from 'react-hook-form';
import { Choice } from '@/components/field/choice';
import { Field, Input } from '@/components/ui/field';
import type { FormValues } from '@/lib/units/observation';

/** What every kind's fields get from the form around them. */
export interface FieldsProps {
  form: UseFormReturn<FormValues>;
  errors: Record<string, string>;
  imperial: boolean;
}

export type FieldsComponent = (props: FieldsProps) => ReactNode;

export function NumberField({
  form,
  errors,
  name,
  label,
  unit,
  hint,
  step = 'any',
}: Omit<FieldsProps, 'imperial'> & { name: string; label: string; unit?: string; hint?: string; step?: string }) {
  return (
    <Field id={`f-${name}`} label={unit ? `${label} (${unit})` : label} error={errors[name]} hint={hint}>
      <Input
        id={`f-${name}`}
        type="number"
        inputMode="decimal"
        step={step}
        {...form.register(name, { setValueAs: (v) => (v === '' ? undefined : Number(v)) })}
      />
    </Field>
  );
}

/** A whole count: buds, canes, spurs. */
export function CountField(props: Omit<FieldsProps, 'imperial'> & { name: string; label: string }) {
  return <NumberField {...props} step="1" />;
}

export function ChoiceField({
  form,
  errors,
  name,
  label,
  options,
}: Omit<FieldsProps, 'imperial'> & { name: string; label: string; options: { value: string | boolean; label: string }[] }) {
  return (
    <Controller
      control={form.control}
      name={name}
      render={({ field }) => (
        <Choice<string | boolean>
          label={label}
          value={field.value as string | boolean | undefined}
          options={options}
          onChange={field.onChange}
          error={errors[name]}
        />
      )}
    />
  );
}

/**
 * A field and the verdict that reads it, kept together: the form scrolls the pair into view while
 * the field has focus (components/field/use-form-fit.ts).
 */
export function Reads({ children }: { children: ReactNode }) {
  return (
    <div data-reads className="flex flex-col gap-2">
      {children}
    </div>
  );
}

export function useChoices() {
  const t = useTranslations('form');
  return {
    yesNo: [
      { value: true, label: t('yes') },
      { value: false, label: t('no') },
    ],
    severities: (['light', 'moderate', 'severe'] as const).map((s) => ({ value: s, label: t(s) })),
  };
}
