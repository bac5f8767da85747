import { memberRoute } from '@/lib/server/http';
import { getFieldLayoutView } from '@/lib/server/services/field';
import { blockIdParams } from '@/lib/validation/params';

/** The block as the phone walks it; the service worker keeps the last answer for offline use. */
export const GET = memberRoute({ params: blockIdParams }, (member, { params }) => getFieldLayoutView(member, params.blockId));
