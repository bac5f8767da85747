import '@fontsource-variable/atkinson-hyperlegible-next';
import '@fontsource-variable/atkinson-hyperlegible-mono';
import './globals.css';
import type { Metadata, Viewport } from 'next';
import type { ReactNode } from 'react';
import { Providers } from '@/components/layout/providers';

export const metadata: Metadata = {
  title: { default: 'Vineward', template: '%s · Vineward' },
  description: 'Vine-by-vine scouting and pruning follow-up for vineyard teams.',
  applicationName: 'Vineward',
};

export const viewport: Viewport = {
  themeColor: '#244a2a',
  width: 'device-width',
  initialScale: 1,
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body className="min-h-dvh">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
