import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { getTranslations } from 'next-intl/server';
import { AppHeader } from '@/components/layout/app-header';
import { PlacesBar } from '@/components/layout/places-bar';
import { can } from '@/lib/roles';
import { currentMember } from '@/lib/server/auth/guard';

export default async function AppLayout({ children }: { children: ReactNode }) {
  const member = await currentMember();
  if (!member) redirect('/signin');
  const t = await getTranslations();
  // Scouts and pruners work from the field places; desk people reach the field from the menu.
  const places =
    member.role === 'scout' || member.role === 'pruner'
      ? [
          { href: '/field', label: t('field.title'), icon: '⌂' },
          ...(can(member.role, 'complete-task') ? [{ href: '/field/tasks', label: t('tasks.title'), icon: '✓' }] : []),
          { href: '/field/outbox', label: t('outbox.title'), icon: '⇅' },
        ]
      : undefined;
  return (
    <div className={places ? 'with-places' : undefined}>
      <AppHeader role={member.role} name={member.name ?? member.email} organisationId={member.organisationId} memberships={member.memberships} />
      <main className="mx-auto max-w-6xl px-3 py-3 sm:px-4 sm:py-6">{children}</main>
      {places && <PlacesBar places={places} />}
    </div>
  );
}
