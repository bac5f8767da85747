import { NextResponse } from 'next/server';
import { z } from 'zod';
import { LOCALE_COOKIE, LOCALES } from '@/i18n/locales';
import { responds } from '@/lib/contracts/http';
import type { LocaleChosen } from '@/lib/contracts/people';
import { memberRoute } from '@/lib/server/http';
import { chooseLocale } from '@/lib/server/services/people';

const schema = z.strictObject({ locale: z.enum(LOCALES, 'Choose English or Spanish') });

/** Each person's language is kept on their account; the cookie mirrors it for this device. */
export const PUT = memberRoute({ body: schema, response: responds<LocaleChosen>() }, async (member, { body }) => {
  const res = NextResponse.json({ locale: await chooseLocale(member, body.locale) });
  res.cookies.set(LOCALE_COOKIE, body.locale, { path: '/', sameSite: 'lax', maxAge: 365 * 24 * 3600 });
  return res;
});
