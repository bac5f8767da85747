import { NextResponse } from 'next/server';
import { ORG_COOKIE } from '@/lib/server/auth/guard';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { switchOrganisationSchema } from '@/lib/validation/auth';

export const PUT = memberRoute({ body: switchOrganisationSchema }, async (member, { body }) => {
  const target = member.memberships.find((m) => m.organisationId === body.organisationId);
  if (!target) throw new AppError('not-found', 'You are not a member of that organisation.');
  const res = NextResponse.json({ organisation: target });
  res.cookies.set(ORG_COOKIE, target.organisationId, { httpOnly: true, sameSite: 'lax', path: '/', maxAge: 365 * 24 * 3600 });
  return res;
});
