import '@fontsource-variable/atkinson-hyperlegible-next';
import '@fontsource-variable/atkinson-hyperlegible-mono';
import './globals.css';
import type { Metadata, Viewport } from 'next';
import { NextIntlClientProvider } from 'next-intl';
import { getLocale, getTranslations } from 'next-intl/server';
import type { ReactNode } from 'react';
import { Providers } from '@/components/layout/providers';
import { ServiceWorker } from '@/components/layout/service-worker';

export const metadata: Metadata = {
  title: { default: 'Vineward', template: '%s · Vineward' },
  description: 'Vine-by-vine scouting and pruning follow-up for vineyard teams.',
  applicationName: 'Vineward',
  appleWebApp: { capable: true, title: 'Vineward', statusBarStyle: 'default' },
  icons: { icon: '/icons/icon-192.png', apple: '/icons/apple-touch-icon.png' },
};

export const viewport: Viewport = {
  themeColor: '#244a2a',
  width: 'device-width',
  initialScale: 1,
};

export default async function RootLayout({ children }: { children: ReactNode }) {
  const locale = await getLocale();
  const t = await getTranslations('sw');
  return (
    <html lang={locale}>
      <body className="min-h-dvh">
        <NextIntlClientProvider>
          <Providers>{children}</Providers>
          <ServiceWorker labels={{ update: t('update'), reload: t('reload') }} />
        </NextIntlClientProvider>
      </body>
    </html>
  );
}
