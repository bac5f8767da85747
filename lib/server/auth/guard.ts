import 'server-only';
import { getServerSession } from 'next-auth';
import { cookies } from 'next/headers';
import { redirect } from 'next/navigation';
import { can, homeFor, type Permission, type Role } from '@/lib/roles';
import { authOptions } from '@/lib/server/auth/options';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import type { MembershipView } from '@/lib/contracts/people';
import { listMemberships } from '@/lib/server/queries/organisations';

export const ORG_COOKIE = 'vw-org';

/** The person behind a request, in the organisation they are working in now. */
export interface Member {
  userId: string;
  email: string;
  name: string | null;
  organisationId: string;
  organisationName: string;
  unitSystem: 'metric' | 'imperial';
  seasonStartMonth: number;
  role: Role;
  memberships: MembershipView[];
}

/**
 * Resolves session → person → current organisation → role, from the database on every call,
 * so a removed member or a changed role takes effect at once. Returns null when signed out.
 */
export async function currentMember(): Promise<Member | null> {
  const session = await getServerSession(authOptions());
  const userId = session?.user?.id;
  if (!userId) return null;
  const memberships = await listMemberships(db(), userId);
  if (memberships.length === 0) return null;
  const wanted = (await cookies()).get(ORG_COOKIE)?.value;
  const current = memberships.find((m) => m.organisationId === wanted) ?? memberships[0]!;
  return {
    userId,
    email: session.user.email ?? '',
    name: session.user.name ?? null,
    organisationId: current.organisationId,
    organisationName: current.organisationName,
    unitSystem: current.unitSystem,
    seasonStartMonth: current.seasonStartMonth,
    role: current.role,
    memberships,
  };
}

/** The one check every route handler and server action makes. */
export async function requireMember(permission: Permission = 'read'): Promise<Member> {
  const member = await currentMember();
  if (!member) throw new AppError('unauthenticated', 'Please sign in to continue.');
  if (!can(member.role, permission)) {
    throw new AppError('forbidden', `Your role (${member.role}) in ${member.organisationName} cannot do this.`);
  }
  return member;
}

/** For pages: the same check, answered with a redirect instead of a JSON error. */
export async function memberForPage(permission: Permission = 'read'): Promise<Member> {
  const member = await currentMember();
  if (!member) redirect('/signin');
  if (!can(member.role, permission)) redirect(homeFor(member.role));
  return member;
}
