import { responds } from '@/lib/contracts/http';
import type { PreferencesAnswer } from '@/lib/contracts/notifications';
import { memberRoute } from '@/lib/server/http';
import { loadPreferences, updatePreferences } from '@/lib/server/services/notification-settings';
import { preferencesSchema } from '@/lib/validation/notification';

const response = responds<PreferencesAnswer>();

/** The signed-in person's choice of notification mails (theirs, in every organisation). */
export const GET = memberRoute({ response }, async (member) => ({ preferences: await loadPreferences(member) }));

export const PUT = memberRoute({ body: preferencesSchema, response }, async (member, { body }) => ({
  preferences: await updatePreferences(member, body),
}));
