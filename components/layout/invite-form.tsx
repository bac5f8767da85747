'use client';

import { useActionState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { ROLES } from '@/lib/roles';
import type { ActionState } from '@/lib/contracts/http';

/** `invite` is the Team page's server action, passed down so components never import app/. */
export function InviteForm({ invite }: { invite: (state: ActionState, form: FormData) => Promise<ActionState> }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(invite, { ok: false });
  return (
    <form action={action} className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-end" aria-describedby="invite-status">
      <Field id="invite-email" label="E-mail" error={state.fields?.email?.[0]}>
        <Input id="invite-email" name="email" type="email" required autoComplete="off" />
      </Field>
      <Field id="invite-role" label="Role" error={state.fields?.role?.[0]}>
        <Select id="invite-role" name="role" defaultValue="scout">
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </Select>
      </Field>
      <Button type="submit" disabled={pending}>
        {pending ? 'Sending…' : 'Send invitation'}
      </Button>
      <div id="invite-status" aria-live="polite" className="sm:col-span-3">
        {state.message && <Notice tone={state.ok ? 'ok' : 'error'}>{state.message}</Notice>}
      </div>
    </form>
  );
}
