import type { ReactNode } from 'react';
import { Wordmark } from '@/components/layout/logo';

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col gap-6 px-4 py-10">
      <Wordmark />
      <div className="rounded-2xl border-2 border-line bg-panel p-5 shadow-sm">{children}</div>
      <p className="text-sm text-bark-faint">Vine-by-vine scouting and pruning follow-up. Works in the row with no signal.</p>
    </main>
  );
}
