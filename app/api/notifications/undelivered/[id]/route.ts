import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { dismissUndeliveredMail, requeueUndeliveredMail } from '@/lib/server/queries/mail-outbox';
import { wakeMailWorker } from '@/lib/server/services/mail-worker';
import { undeliveredActionSchema } from '@/lib/validation/notification';
import { idParams } from '@/lib/validation/params';

/** POST /api/notifications/undelivered/:id {action: resend | dismiss} — send it again, or take it off the list. */
export const POST = memberRoute(
  { permission: 'manage-organisation', body: undeliveredActionSchema, params: idParams('an undelivered mail') },
  async (member, { params: { id }, body }) => {
    const done =
      body.action === 'resend'
        ? await requeueUndeliveredMail(db(), member.organisationId, id)
        : await dismissUndeliveredMail(db(), member.organisationId, id, member.userId);
    if (!done) throw new AppError('not-found', 'There is no undelivered mail with that id in your organisation (it may have been dealt with already).');
    if (body.action === 'resend') wakeMailWorker();
    return { ok: true };
  },
);
