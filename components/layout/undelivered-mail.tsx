'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { Button } from '@/components/ui/button';
import { apiSend } from '@/lib/api-client';
import type { UndeliveredMail } from '@/lib/contracts/notifications';

type UndeliveredMailItem = UndeliveredMail;

const WHY: Record<UndeliveredMailItem['status'], string> = {
  failed: 'The mail server refused it after every attempt.',
  uncertain: 'The server stopped while handing it over: it may have arrived. Sending again may give a second copy.',
};

/** Mail that failed for good or may not have arrived, each with "send again" and "dismiss". */
export function UndeliveredMail({ items }: { items: UndeliveredMailItem[] }) {
  const router = useRouter();
  const act = useMutation({
    mutationFn: async ({ id, action }: { id: string; action: 'resend' | 'dismiss' }) => {
      await apiSend('POST', `/api/notifications/undelivered/${id}`, { action }, { fallback: 'That did not work; try again.' });
    },
    onSettled: () => router.refresh(),
  });
  return (
    <div className="flex flex-col gap-3">
      {act.error && (
        <p role="alert" className="rounded-lg border-2 border-alarm bg-alarm-tint p-2 font-bold">
          {act.error.message}
        </p>
      )}
      <ul className="flex flex-col gap-3">
        {items.map((m) => (
          <li key={m.id} data-testid="undelivered-mail" className="rounded-xl border-2 border-line bg-panel p-3">
            <p className="font-bold">{m.subject}</p>
            <p className="break-all">
              To {m.toEmail}, queued {new Date(m.createdAt).toISOString().slice(0, 16).replace('T', ' ')} UTC, {m.attempts}{' '}
              {m.attempts === 1 ? 'attempt' : 'attempts'}
            </p>
            <p>{WHY[m.status]}</p>
            {m.lastError && <p className="text-sm break-all text-bark-soft">Last answer: {m.lastError}</p>}
            <div className="mt-2 flex flex-wrap gap-2">
              <Button type="button" variant="secondary" disabled={act.isPending} onClick={() => act.mutate({ id: m.id, action: 'resend' })}>
                Send again
              </Button>
              <Button type="button" variant="quiet" disabled={act.isPending} onClick={() => act.mutate({ id: m.id, action: 'dismiss' })}>
                Dismiss
              </Button>
            </div>
          </li>
        ))}
      </ul>
    </div>
  );
}
