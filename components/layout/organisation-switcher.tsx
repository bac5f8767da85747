'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useState, useTransition } from 'react';
import type { Role } from '@/lib/roles';

interface Props {
  current: string;
  memberships: { organisationId: string; organisationName: string; role: Role }[];
}

export function OrganisationSwitcher({ current, memberships }: Props) {
  const router = useRouter();
  const [pending, start] = useTransition();
  // The choice shows at once; the page follows once the server has switched.
  const [chosen, setChosen] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => setChosen(null), [current]);
  if (memberships.length < 2) {
    return <span className="font-bold">{memberships[0]?.organisationName}</span>;
  }
  function switchTo(organisationId: string) {
    setChosen(organisationId);
    setProblem(null);
    start(async () => {
      const res = await fetch('/api/organisations/current', {
        method: 'PUT',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ organisationId }),
      }).catch(() => null);
      if (!res?.ok) {
        setChosen(null);
        setProblem(res ? 'Could not switch organisation.' : 'Could not switch organisation: no connection.');
        return;
      }
      router.push('/');
      router.refresh();
    });
  }
  return (
    <label className="flex items-center gap-2">
      <span className="sr-only">Organisation</span>
      <select
        className="min-h-touch max-w-48 rounded-lg border-2 border-line bg-panel px-2 font-bold"
        value={chosen ?? current}
        disabled={pending}
        onChange={(e) => switchTo(e.target.value)}
      >
        {memberships.map((m) => (
          <option key={m.organisationId} value={m.organisationId}>
            {m.organisationName} ({m.role})
          </option>
        ))}
      </select>
      {problem && (
        <span role="alert" className="text-sm font-bold text-alarm">
          {problem}
        </span>
      )}
    </label>
  );
}
