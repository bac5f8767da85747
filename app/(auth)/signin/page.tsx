import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { SignInForm } from '@/components/auth/sign-in-form';
import { currentMember } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Sign in' };

// Only same-site paths, so a crafted link cannot bounce a person to another site.
const safePath = (value: string | undefined) => (value && value.startsWith('/') && !value.startsWith('//') ? value : '/');

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const params = await searchParams;
  if (await currentMember()) redirect(safePath(params.callbackUrl));
  return (
    <>
      <SignInForm callbackUrl={safePath(params.callbackUrl)} initialError={params.error} />
      {process.env.VINEWARD_DEMO === '1' && (
        <p className="mt-4 text-sm text-bark-faint">
          Demo: manager@example.com, scout@example.com, pruner@example.com or advisor@example.com, password
          <code className="font-mono"> vineward-demo</code>.
        </p>
      )}
    </>
  );
}
