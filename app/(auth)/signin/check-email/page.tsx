import type { Metadata } from 'next';
import Link from 'next/link';

export const metadata: Metadata = { title: 'Check your e-mail' };

export default function CheckEmailPage() {
  return (
    <div className="flex flex-col gap-3">
      <h1 className="text-2xl font-extrabold">Check your e-mail</h1>
      <p>If that address belongs to a Vineward account, a sign-in link is on its way. It works once and expires in 30 minutes.</p>
      <p>
        <Link href="/signin" className="font-bold text-rootstock underline">
          Back to sign in
        </Link>
      </p>
    </div>
  );
}
