'use client';

import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { Button } from '@/components/ui/button';
import { apiSend, problemText, type SendMethod } from '@/lib/api-client';

async function send(url: string, method: SendMethod, body?: unknown) {
  try {
    await apiSend(method, url, body, { fallback: 'That did not work; try again.' });
    return null;
  } catch (err) {
    return problemText(err, 'No connection: try again when there is signal.');
  }
}

function useAction() {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [problem, setProblem] = useState<string | null>(null);
  const run = (work: () => Promise<string | null>, then: () => void) =>
    start(async () => {
      setProblem(null);
      const failed = await work();
      if (failed) setProblem(failed);
      else then();
    });
  return { router, pending, problem, run };
}

function Problem({ text }: { text: string | null }) {
  return text ? (
    <p role="alert" className="mt-2 font-bold text-alarm">
      {text}
    </p>
  ) : null;
}

/** Starts the manager's next "new since" window now. */
export function MarkSeenButton() {
  const { router, pending, problem, run } = useAction();
  return (
    <div>
      <Button
        type="button"
        variant="secondary"
        disabled={pending}
        onClick={() =>
          run(
            () => send('/api/desk/seen', 'POST'),
            () => router.refresh(),
          )
        }
      >
        Mark all as seen
      </Button>
      <Problem text={problem} />
    </div>
  );
}

/** Switches to another organisation the advisor serves and opens its Desk. */
export function OpenOrganisationButton({ organisationId, name }: { organisationId: string; name: string }) {
  const { router, pending, problem, run } = useAction();
  return (
    <div>
      <Button
        type="button"
        variant="secondary"
        disabled={pending}
        onClick={() =>
          run(
            () => send('/api/organisations/current', 'PUT', { organisationId }),
            () => {
              router.push('/desk');
              router.refresh();
            },
          )
        }
      >
        Open {name}
      </Button>
      <Problem text={problem} />
    </div>
  );
}
