import type { Metadata } from 'next';
import Link from 'next/link';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { getPreferences } from '@/lib/server/queries/notifications';
import { PreferencesForm } from './preferences-form';

export const metadata: Metadata = { title: 'Notification mail' };

export default async function NotificationSettingsPage() {
  const member = await memberForPage();
  const preferences = await getPreferences(db(), member.userId);
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <div>
        <p className="text-bark-soft">
          <Link href="/settings" className="underline">
            Settings
          </Link>
        </p>
        <h1 className="text-3xl font-extrabold">Notification mail</h1>
        <p className="mt-1">
          Which e-mails Vineward sends you, at {member.email}. Your choice holds in every organisation you belong to. Sign-in links and invitations always come.
        </p>
      </div>
      <PreferencesForm initial={preferences} />
    </div>
  );
}
