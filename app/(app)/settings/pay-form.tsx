'use client';

import { useActionState, useState } from 'react';
import { savePayBasis } from '@/app/(app)/settings/pay-actions';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import type { ActionState } from '@/lib/contracts/http';
import type { PayBasis } from '@/lib/work/cost';

export function PayForm({ current }: { current: PayBasis }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(savePayBasis, { ok: false });
  const [basis, setBasis] = useState(current.basis);
  return (
    <form action={action} className="flex flex-col gap-3">
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">Pay basis</legend>
        {(
          [
            ['hourly', 'By the hour: person-hours × hourly rate'],
            ['piece-rate', 'Piece rate: vines worked × rate per vine (each vine paid once per pass)'],
          ] as const
        ).map(([value, label]) => (
          <label key={value} className="flex min-h-touch items-center gap-3">
            <input type="radio" name="basis" value={value} checked={basis === value} onChange={() => setBasis(value)} className="size-6" />
            {label}
          </label>
        ))}
      </fieldset>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id="pay-hourly" label="Hourly rate (per person-hour)" error={state.fields?.hourlyRate?.[0]}>
          <Input id="pay-hourly" name="hourlyRate" inputMode="decimal" defaultValue={current.hourlyRate ?? ''} />
        </Field>
        <Field id="pay-piece" label="Piece rate (per vine)" error={state.fields?.pieceRatePerVine?.[0]}>
          <Input id="pay-piece" name="pieceRatePerVine" inputMode="decimal" defaultValue={current.pieceRatePerVine ?? ''} />
        </Field>
      </div>
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? 'Saving…' : 'Save pay basis'}
      </Button>
      <div aria-live="polite">{state.message && <Notice tone={state.ok ? 'ok' : 'error'}>{state.message}</Notice>}</div>
    </form>
  );
}
