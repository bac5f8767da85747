'use client';

import { useActionState } from 'react';
import { saveUnitPreference } from '@/app/(app)/settings/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import type { ActionState } from '@/lib/contracts/http';
import { formatAreaM2, formatLengthM, formatLengthMm, type UnitSystem } from '@/lib/units';

const CHOICES: { value: UnitSystem; label: string }[] = [
  { value: 'metric', label: 'Metric' },
  { value: 'imperial', label: 'Imperial' },
];

export function UnitForm({ current }: { current: UnitSystem }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(saveUnitPreference, { ok: false });
  return (
    <form action={action} className="flex flex-col gap-3">
      <fieldset className="grid gap-2 sm:grid-cols-2">
        <legend className="mb-2 font-bold">Units for lengths and areas</legend>
        {CHOICES.map((c) => (
          <label
            key={c.value}
            className="flex min-h-touch cursor-pointer items-start gap-3 rounded-lg border-2 border-line bg-panel p-3 has-checked:border-rootstock has-checked:bg-rootstock-tint"
          >
            <input type="radio" name="unitSystem" value={c.value} defaultChecked={current === c.value} className="mt-1 size-6 accent-rootstock" />
            <span>
              <span className="block font-bold">{c.label}</span>
              <span className="text-sm">
                e.g. {formatLengthM(2.4, c.value)}, {formatLengthMm(9.5, c.value)}, {formatAreaM2(12_000, c.value)}
              </span>
            </span>
          </label>
        ))}
      </fieldset>
      {state.fields?.unitSystem && <Notice tone="error">{state.fields.unitSystem[0]}</Notice>}
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? 'Saving…' : 'Save units'}
      </Button>
      <div aria-live="polite">{state.message && <Notice tone={state.ok ? 'ok' : 'error'}>{state.message}</Notice>}</div>
    </form>
  );
}
