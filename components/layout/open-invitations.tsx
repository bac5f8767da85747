'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { Button } from '@/components/ui/button';
import { apiSend } from '@/lib/api-client';

export interface OpenInvitation {
  id: string;
  email: string;
  role: string;
  expiresOn: string;
}

/** Invitations nobody accepted yet, each with a button that revokes it (its link stops working). */
export function OpenInvitations({ items }: { items: OpenInvitation[] }) {
  const router = useRouter();
  const revoke = useMutation({
    mutationFn: async (id: string) => {
      await apiSend('DELETE', `/api/invitations/${id}`, undefined, { fallback: 'That did not work; try again.' });
    },
    onSettled: () => router.refresh(),
  });
  return (
    <div className="flex flex-col gap-3">
      {revoke.error && (
        <p role="alert" className="rounded-lg border-2 border-alarm bg-alarm-tint p-2 font-bold">
          {revoke.error.message}
        </p>
      )}
      <ul className="flex flex-col gap-2">
        {items.map((i) => (
          <li
            key={i.id}
            data-testid="open-invitation"
            className="flex flex-wrap items-center justify-between gap-2 rounded-xl border-2 border-line bg-panel p-3"
          >
            <span className="break-all">
              {i.email} as <strong>{i.role}</strong>, expires {i.expiresOn}
            </span>
            <Button
              type="button"
              variant="secondary"
              disabled={revoke.isPending}
              aria-label={`Revoke the invitation for ${i.email}`}
              onClick={() => revoke.mutate(i.id)}
            >
              Revoke
            </Button>
          </li>
        ))}
      </ul>
      <p className="text-sm text-bark-soft">A revoked link stops working at once. Revoked invitations still count towards your invitations for the day.</p>
    </div>
  );
}
