import { responds } from '@/lib/contracts/http';
import type { UndeliveredList } from '@/lib/contracts/notifications';
import { memberRoute } from '@/lib/server/http';
import { listUndelivered } from '@/lib/server/services/notification-settings';

/** GET /api/notifications/undelivered — the organisation's mail that failed for good or may not have arrived. */
export const GET = memberRoute({ permission: 'manage-organisation', response: responds<UndeliveredList>() }, async (member) => ({
  mail: await listUndelivered(member),
}));
