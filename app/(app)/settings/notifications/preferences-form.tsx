'use client';

import { useState } from 'react';
import { apiSend } from '@/lib/api-client';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import type { PreferencesAnswer } from '@/lib/contracts/notifications';
import { NOTIFICATION_KINDS, type NotificationKind, type Preferences } from '@/lib/validation/notification';

const LABELS: Record<NotificationKind, { title: string; detail: string }> = {
  assignment: { title: 'A task for me', detail: 'When a manager gives you a task or hands one over to you.' },
  comment: { title: 'Comments on my findings and tasks', detail: 'When someone comments on what you recorded or flagged, or on a task of yours.' },
  mention: { title: 'Mentions', detail: 'When someone writes @your name in a comment.' },
  overdue: { title: 'Overdue tasks', detail: 'Once, when a task of yours passes its due date unfinished.' },
  digest: { title: 'Daily digest', detail: 'One mail a morning with your open tasks and the comments for you. Each digest has a link to stop it.' },
};

export function PreferencesForm({ initial }: { initial: Preferences }) {
  const [prefs, setPrefs] = useState(initial);
  const [state, setState] = useState<{ tone: 'ok' | 'error'; message: string }>();
  const [saving, setSaving] = useState(false);

  async function save() {
    setSaving(true);
    setState(undefined);
    try {
      const { preferences } = await apiSend<PreferencesAnswer>('PUT', '/api/notifications/preferences', prefs);
      setPrefs(preferences);
      setState({ tone: 'ok', message: 'Saved.' });
    } catch (err) {
      setState({ tone: 'error', message: (err as Error).message });
    } finally {
      setSaving(false);
    }
  }

  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
    >
      <fieldset className="flex flex-col gap-2">
        <legend className="sr-only">Mail you get</legend>
        {NOTIFICATION_KINDS.map((kind) => (
          <label
            key={kind}
            className="flex min-h-touch cursor-pointer items-start gap-3 rounded-lg border-2 border-line bg-panel p-3 has-checked:border-rootstock"
          >
            <input
              type="checkbox"
              name={kind}
              checked={prefs[kind]}
              onChange={(e) => setPrefs((p) => ({ ...p, [kind]: e.target.checked }))}
              className="mt-1 size-6 accent-rootstock"
            />
            <span>
              <span className="block font-bold">{LABELS[kind].title}</span>
              <span className="text-sm">{LABELS[kind].detail}</span>
            </span>
          </label>
        ))}
      </fieldset>
      <Button type="submit" disabled={saving} className="self-start">
        {saving ? 'Saving…' : 'Save my choices'}
      </Button>
      <div aria-live="polite">{state && <Notice tone={state.tone}>{state.message}</Notice>}</div>
    </form>
  );
}
