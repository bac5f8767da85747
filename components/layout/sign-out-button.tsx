'use client';

import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { signOut } from '@/lib/auth-client';
import { describeWaiting, waitingOnThisPhone, type Waiting } from '@/lib/shared-phone';

/**
 * Signs out on a shared phone. When records saved here still wait to be sent, the person is told
 * first that they stay on this phone for their owner, and chooses to sign out or to stay.
 */
export function SignOutButton() {
  const dialog = useRef<HTMLDialogElement>(null);
  const [waiting, setWaiting] = useState<Waiting>();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string>();

  useEffect(() => {
    if (waiting) dialog.current?.showModal();
  }, [waiting]);

  const leave = async () => {
    setBusy(true);
    setProblem(undefined);
    try {
      await signOut();
    } catch {
      setBusy(false);
      setProblem('Signing out needs a connection. Nothing was removed from this phone; try again when you have signal.');
    }
  };

  const start = async () => {
    const now = await waitingOnThisPhone().catch(() => ({ records: 0, photos: 0 }));
    if (now.records + now.photos > 0) setWaiting(now);
    else await leave();
  };

  const close = () => {
    dialog.current?.close();
    setWaiting(undefined);
    setProblem(undefined);
  };

  const said = waiting && describeWaiting(waiting);
  return (
    <>
      <button
        type="button"
        className="min-h-touch rounded-lg px-3 font-bold text-bark-soft hover:bg-rootstock-tint"
        disabled={busy}
        onClick={() => void start()}
      >
        Sign out
      </button>
      {problem && !waiting && (
        <div className="w-full">
          <Notice tone="error">{problem}</Notice>
        </div>
      )}
      <dialog
        ref={dialog}
        role="alertdialog"
        aria-labelledby="sign-out-title"
        aria-describedby="sign-out-waiting"
        onClose={() => setWaiting(undefined)}
        className="m-auto w-[min(28rem,calc(100vw-2rem))] rounded-lg border-2 border-line bg-panel p-5 text-bark backdrop:bg-black/50"
      >
        {said && (
          <div className="flex flex-col gap-4">
            <h2 id="sign-out-title" className="text-xl font-extrabold">
              Not everything is sent yet
            </h2>
            <p id="sign-out-waiting">
              {said.text} {said.one ? 'is' : 'are'} still waiting to be sent. {said.one ? 'It stays' : 'They stay'} on this phone and {said.one ? 'goes' : 'go'}{' '}
              out the next time the person who saved {said.one ? 'it' : 'them'} signs in here with a connection.
            </p>
            {problem && <Notice tone="error">{problem}</Notice>}
            <div className="flex flex-col gap-2 sm:flex-row-reverse">
              <Button type="button" disabled={busy} onClick={() => void leave()}>
                {busy ? 'Signing out…' : `Sign out and keep ${said.one ? 'it' : 'them'} here`}
              </Button>
              <Button type="button" variant="secondary" disabled={busy} onClick={close}>
                Stay signed in
              </Button>
            </div>
          </div>
        )}
      </dialog>
    </>
  );
}
