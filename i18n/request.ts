import { getRequestConfig } from 'next-intl/server';
import { cookies } from 'next/headers';
import { isLocale, LOCALE_COOKIE, type Locale } from '@/i18n/locales';

// The person's language is kept on their account and mirrored in a cookie, so that pages (and the
// copies the service worker keeps for offline use) render in it without a database round trip.
export default getRequestConfig(async () => {
  const fromCookie = (await cookies()).get(LOCALE_COOKIE)?.value;
  const locale: Locale = isLocale(fromCookie) ? fromCookie : 'en';
  return { locale, messages: (await import(`../messages/${locale}.json`)).default, timeZone: process.env.TZ || 'UTC' };
});
