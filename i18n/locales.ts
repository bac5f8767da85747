export const LOCALES = ['en', 'es'] as const;
export type Locale = (typeof LOCALES)[number];
export const LOCALE_COOKIE = 'vw-locale';
export const LOCALE_NAMES: Record<Locale, string> = { en: 'English', es: 'Español' };

export const isLocale = (value: unknown): value is Locale => typeof value === 'string' && (LOCALES as readonly string[]).includes(value);
