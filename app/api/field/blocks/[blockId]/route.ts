import type { FieldLayout } from '@/lib/contracts/field';
import { responds } from '@/lib/contracts/http';
import { memberRoute } from '@/lib/server/http';
import { fieldLayout } from '@/lib/server/services/field';
import { blockIdParams } from '@/lib/validation/params';

/** The block as the phone walks it; the service worker keeps the last answer for offline use. */
export const GET = memberRoute({ params: blockIdParams, response: responds<FieldLayout>() }, async (member, { params }) => fieldLayout(member, params.blockId));
