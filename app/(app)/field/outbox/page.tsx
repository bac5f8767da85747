import type { Metadata } from 'next';
import { getTranslations } from 'next-intl/server';
import { OutboxList } from '@/components/field/outbox-list';
import { memberForPage } from '@/lib/server/auth/guard';

export const metadata: Metadata = { title: 'Outbox' };

export default async function OutboxPage() {
  const member = await memberForPage();
  const t = await getTranslations('outbox');
  return (
    <div className="flex flex-col gap-3">
      <h1 className="text-3xl font-extrabold">{t('title')}</h1>
      <OutboxList owner={member.email} imperial={member.unitSystem === 'imperial'} />
    </div>
  );
}
