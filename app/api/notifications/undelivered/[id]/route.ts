import { isUuid } from '@/lib/grid/filters';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { memberRoute } from '@/lib/server/http';
import { dismissUndeliveredMail, requeueUndeliveredMail } from '@/lib/server/queries/mail-outbox';
import { wakeMailWorker } from '@/lib/server/services/mail-worker';
import { undeliveredActionSchema } from '@/lib/validation/notification';

/** POST /api/notifications/undelivered/:id {action: resend | dismiss} — send it again, or take it off the list. */
export const POST = memberRoute({ permission: 'manage-organisation', body: undeliveredActionSchema }, async (member, { params, body }) => {
  const id = isUuid(params.id) ? params.id : undefined;
  const done = id
    ? body.action === 'resend'
      ? await requeueUndeliveredMail(db(), member.organisationId, id)
      : await dismissUndeliveredMail(db(), member.organisationId, id, member.userId)
    : false;
  if (!done) throw new AppError('not-found', 'There is no undelivered mail with that id in your organisation (it may have been dealt with already).');
  if (body.action === 'resend') wakeMailWorker();
  return { ok: true };
});
