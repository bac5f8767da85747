'use client';

import { useRouter } from 'next/navigation';
import { useLocale, useTranslations } from 'next-intl';
import { useEffect, useTransition } from 'react';
import { LOCALE_NAMES, LOCALES, type Locale } from '@/i18n/locales';
import { cn } from '@/lib/cn';
import { apiSend } from '@/lib/api-client';

async function saveLocale(locale: Locale) {
  // The cookie and the page follow even when the account could not be told (offline): the next save catches up.
  await apiSend('PUT', '/api/me/locale', { locale }).catch(() => undefined);
}

/** Big two-way switch; the choice is saved on the person's account and remembered on this phone. */
export function LanguageSwitch({ saved }: { saved: Locale }) {
  const t = useTranslations('field');
  const current = useLocale();
  const router = useRouter();
  const [pending, start] = useTransition();

  // A new phone has no cookie yet: bring it in line with the account once.
  useEffect(() => {
    if (saved !== current)
      start(async () => {
        await saveLocale(saved);
        router.refresh();
      });
  }, [saved, current, router]);

  return (
    <fieldset className="flex items-center gap-2">
      <legend className="sr-only">{t('language')}</legend>
      {LOCALES.map((l) => (
        <button
          key={l}
          type="button"
          lang={l}
          aria-pressed={current === l}
          disabled={pending}
          onClick={() =>
            start(async () => {
              await saveLocale(l);
              router.refresh();
            })
          }
          className={cn('min-h-touch flex-1 rounded-lg border-2 px-3 font-bold', current === l ? 'border-rootstock bg-rootstock-tint' : 'border-line bg-panel')}
        >
          {LOCALE_NAMES[l]}
        </button>
      ))}
    </fieldset>
  );
}
