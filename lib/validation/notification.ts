/** Which notification mails a person gets. Everything but the daily digest is on until they turn it off. */
import { z } from 'zod';

export const NOTIFICATION_KINDS = ['assignment', 'comment', 'mention', 'overdue', 'digest'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export const DEFAULT_PREFERENCES: Record<NotificationKind, boolean> = {
  assignment: true,
  comment: true,
  mention: true,
  overdue: true,
  digest: false,
};

export const preferencesSchema = z.strictObject({
  assignment: z.boolean('Must be true or false'),
  comment: z.boolean('Must be true or false'),
  mention: z.boolean('Must be true or false'),
  overdue: z.boolean('Must be true or false'),
  digest: z.boolean('Must be true or false'),
});
export type Preferences = z.infer<typeof preferencesSchema>;

export const unsubscribeSchema = z.strictObject({
  token: z.string('The link is incomplete').min(10, 'The link is incomplete').max(200, 'The link is not one of ours'),
});

/** What a manager does with mail that failed or may not have arrived. */
export const undeliveredActionSchema = z.strictObject({
  action: z.enum(['resend', 'dismiss'], 'Must be resend or dismiss'),
});
