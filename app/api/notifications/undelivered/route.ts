import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { listUndeliveredMail } from '@/lib/server/queries/mail-outbox';

/** GET /api/notifications/undelivered — the organisation's mail that failed for good or may not have arrived. */
export const GET = memberRoute({ permission: 'manage-organisation' }, async (member) => ({ mail: await listUndeliveredMail(db(), member.organisationId) }));
