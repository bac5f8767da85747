import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { AppHeader } from '@/components/layout/app-header';
import { currentMember } from '@/lib/server/auth/guard';

export default async function AppLayout({ children }: { children: ReactNode }) {
  const member = await currentMember();
  if (!member) redirect('/signin');
  return (
    <>
      <AppHeader
        role={member.role}
        name={member.name ?? member.email}
        organisationId={member.organisationId}
        memberships={member.memberships}
      />
      <main className="mx-auto max-w-6xl px-4 py-6">{children}</main>
    </>
  );
}
