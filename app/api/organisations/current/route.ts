import { NextResponse } from 'next/server';
import { responds } from '@/lib/contracts/http';
import type { OrganisationChosen } from '@/lib/contracts/people';
import { ORG_COOKIE } from '@/lib/server/auth/guard';
import { memberRoute } from '@/lib/server/http';
import { membershipOf } from '@/lib/server/services/people';
import { switchOrganisationSchema } from '@/lib/validation/auth';

export const PUT = memberRoute({ body: switchOrganisationSchema, response: responds<OrganisationChosen>() }, async (member, { body }) => {
  const target = membershipOf(member, body.organisationId);
  const res = NextResponse.json({ organisation: target });
  res.cookies.set(ORG_COOKIE, target.organisationId, { httpOnly: true, sameSite: 'lax', path: '/', maxAge: 365 * 24 * 3600 });
  return res;
});
