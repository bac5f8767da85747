import 'server-only';
import type { Locale } from '@/i18n/locales';
import type { Me, MembershipView } from '@/lib/contracts/people';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { listMembers } from '@/lib/server/queries/organisations';
import { updateUser } from '@/lib/server/queries/users';

export const describeMe = (member: Member): Me => ({
  user: { id: member.userId, email: member.email, name: member.name },
  organisation: { id: member.organisationId, name: member.organisationName, unitSystem: member.unitSystem },
  role: member.role,
  memberships: member.memberships,
});

export const listCrew = (member: Member) => listMembers(db(), member.organisationId);

/** Each person's language is kept on their account (the route mirrors it in a cookie for this device). */
export async function chooseLocale(member: Member, locale: Locale) {
  await updateUser(db(), member.userId, { locale });
  return locale;
}

/** One of the person's own organisations, to make current; any other is not found. */
export function membershipOf(member: Member, organisationId: string): MembershipView {
  const target = member.memberships.find((m) => m.organisationId === organisationId);
  if (!target) throw new AppError('not-found', 'You are not a member of that organisation.');
  return target;
}
