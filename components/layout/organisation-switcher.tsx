'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useState, useTransition } from 'react';
import type { Role } from '@/lib/roles';
import { apiSend, ApiError } from '@/lib/api-client';

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
      try {
        await apiSend('PUT', '/api/organisations/current', { organisationId });
      } catch (err) {
        setChosen(null);
        setProblem(err instanceof ApiError && err.code === 'offline' ? 'Could not switch organisation: no connection.' : 'Could not switch organisation.');
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
