import { db } from '@/lib/server/db';
import { memberRoute } from '@/lib/server/http';
import { getPreferences, savePreferences } from '@/lib/server/queries/notifications';
import { wakeMailWorker } from '@/lib/server/services/mail-worker';
import { preferencesSchema } from '@/lib/validation/notification';

/** The signed-in person's choice of notification mails (theirs, in every organisation). */
export const GET = memberRoute({}, async (member) => ({ preferences: await getPreferences(db(), member.userId) }));

export const PUT = memberRoute({ body: preferencesSchema }, async (member, { body }) => {
  await savePreferences(db(), member.userId, body);
  // A new digest subscriber gets the digest that is due now, not tomorrow's.
  if (body.digest) wakeMailWorker({ schedule: true });
  return { preferences: await getPreferences(db(), member.userId) };
});
