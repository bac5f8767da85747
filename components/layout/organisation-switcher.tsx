'use client';

import { useRouter } from 'next/navigation';
import { useTransition } from 'react';
import type { Role } from '@/lib/roles';

interface Props {
  current: string;
  memberships: { organisationId: string; organisationName: string; role: Role }[];
}

export function OrganisationSwitcher({ current, memberships }: Props) {
  const router = useRouter();
  const [pending, start] = useTransition();
  if (memberships.length < 2) {
    return <span className="font-bold">{memberships[0]?.organisationName}</span>;
  }
  return (
    <label className="flex items-center gap-2">
      <span className="sr-only">Organisation</span>
      <select
        className="min-h-touch max-w-48 rounded-lg border-2 border-line bg-panel px-2 font-bold"
        value={current}
        disabled={pending}
        onChange={(e) =>
          start(async () => {
            await fetch('/api/organisations/current', {
              method: 'PUT',
              headers: { 'content-type': 'application/json' },
              body: JSON.stringify({ organisationId: e.target.value }),
            });
            router.push('/');
            router.refresh();
          })
        }
      >
        {memberships.map((m) => (
          <option key={m.organisationId} value={m.organisationId}>
            {m.organisationName} ({m.role})
          </option>
        ))}
      </select>
    </label>
  );
}
