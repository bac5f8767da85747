import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { listMembers } from '@/lib/server/queries/organisations';

export const GET = memberRoute({}, async (member) => ({ members: await listMembers(db(), member.organisationId) }));
