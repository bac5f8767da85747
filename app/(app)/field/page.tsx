import type { Metadata } from 'next';
import { getTranslations } from 'next-intl/server';
import { FieldBlockList } from '@/components/field/field-block-list';
import { LanguageSwitch } from '@/components/field/language-switch';
import { ButtonLink } from '@/components/ui/button';
import { isLocale } from '@/i18n/locales';
import { memberForPage } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { getUserById } from '@/lib/server/queries/users';
import { listBlockViews } from '@/lib/server/services/blocks';

export const metadata: Metadata = { title: 'Field' };

export default async function FieldPage() {
  const member = await memberForPage();
  const t = await getTranslations('field');
  const [user, blocks] = await Promise.all([getUserById(db(), member.userId), listBlockViews(member)]);
  const initial = blocks.map((b) => ({ id: b.id, name: b.name, variety: b.variety, rowCount: b.rowCount, vineCount: b.vineCount }));
  return (
    <div className="flex flex-col gap-4">
      <div>
        <p className="text-bark-soft">{member.organisationName}</p>
        <h1 className="text-3xl font-extrabold">{t('title')}</h1>
        <p className="mt-1">{t('hello', { name: member.name ?? member.email })}</p>
      </div>
      <LanguageSwitch saved={isLocale(user?.locale) ? user.locale : 'en'} />
      <h2 className="text-xl font-bold">{t('chooseBlock')}</h2>
      <FieldBlockList initial={initial} />
      <ButtonLink href="/field/outbox" prefetch={false} variant="secondary">
        {t('outbox')}
      </ButtonLink>
      <ButtonLink href="/safety" prefetch={false} variant="secondary">
        {t('cautions')}
      </ButtonLink>
    </div>
  );
}
