import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { SignInForm } from '@/components/auth/sign-in-form';
import { WaitingOnPhone } from '@/components/auth/waiting-on-phone';
import { getEnv } from '@/lib/env';
import { sameOriginPath } from '@/lib/safe-redirect';
import { currentMember } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const params = await searchParams;
  // Only paths of this site, so a crafted link cannot bounce a person to another one.
  const next = sameOriginPath(params.callbackUrl, getEnv().NEXTAUTH_URL);
  if (await currentMember()) redirect(next);
  return (
    <>
      <WaitingOnPhone />
      <SignInForm callbackUrl={next} initialError={params.error} />
      {getEnv().VINEWARD_DEMO && (
        <p className="mt-4 text-sm text-bark-faint">
          Demo: manager@example.com, scout@example.com, pruner@example.com or advisor@example.com, password
          <code className="font-mono"> vineward-demo</code>.
        </p>
      )}
    </>
  );
}
