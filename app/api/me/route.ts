import { memberRoute } from '@/lib/server/http';

export const GET = memberRoute({}, async (member) => ({
  user: { id: member.userId, email: member.email, name: member.name },
  organisation: { id: member.organisationId, name: member.organisationName, unitSystem: member.unitSystem },
  role: member.role,
  memberships: member.memberships,
}));
