import { responds } from '@/lib/contracts/http';
import type { Me } from '@/lib/contracts/people';
import { memberRoute } from '@/lib/server/http';
import { describeMe } from '@/lib/server/services/people';

export const GET = memberRoute({ response: responds<Me>() }, async (member) => describeMe(member));
