import 'server-only';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { dismissUndeliveredMail, listUndeliveredMail, requeueUndeliveredMail } from '@/lib/server/queries/mail-outbox';
import { getPreferences, savePreferences } from '@/lib/server/queries/notifications';
import { userExists } from '@/lib/server/queries/users';
import { wakeMailWorker } from '@/lib/server/services/mail-worker';
import { verifyUnsubscribeToken } from '@/lib/server/services/notifications';
import type { Preferences } from '@/lib/validation/notification';

/** The signed-in person's choice of notification mails (theirs, in every organisation). */
export const loadPreferences = (member: Member) => getPreferences(db(), member.userId);

export async function updatePreferences(member: Member, prefs: Preferences) {
  await savePreferences(db(), member.userId, prefs);
  // A new digest subscriber gets the digest that is due now, not tomorrow's.
  if (prefs.digest) wakeMailWorker({ schedule: true });
  return getPreferences(db(), member.userId);
}

const BAD_LINK = 'This unsubscribe link is not valid. Sign in and change your notification settings instead.';

/** Turns the daily digest off for the person a signed unsubscribe token names, without signing in. */
export async function unsubscribeDigest(token: string) {
  const userId = verifyUnsubscribeToken(token);
  if (!userId || !(await userExists(db(), userId))) throw new AppError('not-found', BAD_LINK);
  await savePreferences(db(), userId, { digest: false });
}

export const listUndelivered = (member: Member) => listUndeliveredMail(db(), member.organisationId);

/** Sends an undelivered mail again, or takes it off the list. */
export async function actOnUndelivered(member: Member, id: string, action: 'resend' | 'dismiss') {
  const done =
    action === 'resend'
      ? await requeueUndeliveredMail(db(), member.organisationId, id)
      : await dismissUndeliveredMail(db(), member.organisationId, id, member.userId);
  if (!done) throw new AppError('not-found', 'There is no undelivered mail with that id in your organisation (it may have been dealt with already).');
  if (action === 'resend') wakeMailWorker();
}
