import { responds } from '@/lib/contracts/http';
import type { MemberList } from '@/lib/contracts/people';
import { memberRoute } from '@/lib/server/http';
import { listCrew } from '@/lib/server/services/people';

export const GET = memberRoute({ response: responds<MemberList>() }, async (member) => ({ members: await listCrew(member) }));
