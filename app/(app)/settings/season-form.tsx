'use client';

import { useActionState } from 'react';
import { saveSeasonStart } from '@/app/(app)/settings/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { MONTHS } from '@/lib/reports/season';
import type { ActionState } from '@/lib/contracts/http';

export function SeasonForm({ current }: { current: number }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(saveSeasonStart, { ok: false });
  return (
    <form action={action} className="flex flex-col gap-3">
      <label htmlFor="season-start" className="font-bold">
        Seasons start in
      </label>
      <select
        id="season-start"
        name="seasonStartMonth"
        defaultValue={current}
        className="min-h-touch max-w-xs rounded-lg border-2 border-line bg-panel px-3 text-base"
        aria-describedby="season-start-hint"
      >
        {MONTHS.map((m, i) => (
          <option key={m} value={i + 1}>
            {m}
          </option>
        ))}
      </select>
      <p id="season-start-hint" className="text-sm text-bark-soft">
        January keeps seasons as calendar years. A later month suits an estate whose pruning and harvest fall in different calendar years: with July, season
        2026 runs from 1 July 2025 to 30 June 2026.
      </p>
      {state.fields?.seasonStartMonth && <Notice tone="error">{state.fields.seasonStartMonth[0]}</Notice>}
      <Button type="submit" disabled={pending} className="self-start">
        {pending ? 'Saving…' : 'Save season start'}
      </Button>
      <div aria-live="polite">{state.message && <Notice tone={state.ok ? 'ok' : 'error'}>{state.message}</Notice>}</div>
    </form>
  );
}
