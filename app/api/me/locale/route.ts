import { NextResponse } from 'next/server';
import { z } from 'zod';
import { LOCALE_COOKIE, LOCALES } from '@/i18n/locales';
import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { updateUser } from '@/lib/server/queries/users';

const schema = z.strictObject({ locale: z.enum(LOCALES, 'Choose English or Spanish') });

/** Each person's language is kept on their account; the cookie mirrors it for this device. */
export const PUT = memberRoute({ body: schema }, async (member, { body }) => {
  await updateUser(db(), member.userId, { locale: body.locale });
  const res = NextResponse.json({ locale: body.locale });
  res.cookies.set(LOCALE_COOKIE, body.locale, { path: '/', sameSite: 'lax', maxAge: 365 * 24 * 3600 });
  return res;
});
