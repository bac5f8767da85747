import type { Metadata } from 'next';
import { Wordmark } from '@/components/layout/logo';
import { Notice } from '@/components/ui/field';
import { verifyUnsubscribeToken } from '@/lib/server/services/notifications';
import { UnsubscribeButton } from './unsubscribe-button';

export const metadata: Metadata = { title: 'Stop the daily digest', robots: { index: false } };

/**
 * Reached from the link in a digest, signed in or not. Opening the page changes nothing (mail
 * scanners open links); the button does.
 */
export default async function UnsubscribePage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  const valid = typeof token === 'string' && verifyUnsubscribeToken(token) !== null;
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col gap-6 px-4 py-10">
      <Wordmark />
      <div className="flex flex-col gap-4 rounded-2xl border-2 border-line bg-panel p-5 shadow-sm">
        <h1 className="text-2xl font-extrabold">Stop the daily digest</h1>
        {valid ? (
          <>
            <p>You will no longer get the daily digest. Mail about your tasks, comments and mentions keeps coming unless you turn it off in your settings.</p>
            <UnsubscribeButton token={token} />
          </>
        ) : (
          <Notice tone="error">This link is not complete or not one of ours. Sign in and change your notification settings instead.</Notice>
        )}
      </div>
    </main>
  );
}
