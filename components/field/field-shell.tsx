'use client';

import { useEffect, type ReactNode } from 'react';
import { SyncStatusBar } from '@/components/field/sync-status-bar';
import { startSync } from '@/lib/offline/sync';

/** Starts the outbox sync for the signed-in person and keeps the status bar on every field screen. */
export function FieldShell({ owner, children }: { owner: string; children: ReactNode }) {
  useEffect(() => {
    void startSync(owner);
  }, [owner]);
  return (
    <>
      <SyncStatusBar />
      <div className="mx-auto max-w-md py-2 sm:px-3 sm:py-4">{children}</div>
    </>
  );
}
