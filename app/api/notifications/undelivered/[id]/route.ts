import { responds } from '@/lib/contracts/http';
import type { Done } from '@/lib/contracts/notifications';
import { memberRoute } from '@/lib/server/http';
import { actOnUndelivered } from '@/lib/server/services/notification-settings';
import { undeliveredActionSchema } from '@/lib/validation/notification';
import { idParams } from '@/lib/validation/params';

/** POST /api/notifications/undelivered/:id {action: resend | dismiss} — send it again, or take it off the list. */
export const POST = memberRoute(
  { permission: 'manage-organisation', body: undeliveredActionSchema, params: idParams('an undelivered mail'), response: responds<Done>() },
  async (member, { params: { id }, body }) => {
    await actOnUndelivered(member, id, body.action);
    return { ok: true } as const;
  },
);
