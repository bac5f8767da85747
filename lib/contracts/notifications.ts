/** Notification mail: what /api/notifications/** answer. The request schemas are in lib/validation/notification.ts. */
import type { NotificationKind, Preferences } from '@/lib/validation/notification';

export type { Preferences };

export interface PreferencesAnswer {
  preferences: Preferences;
}

/** A mail that failed for good, or may not have arrived (the worker stopped during the SMTP call). */
export interface UndeliveredMail<T = string> {
  id: string;
  toEmail: string;
  kind: NotificationKind;
  subject: string;
  status: 'failed' | 'uncertain';
  attempts: number;
  lastError: string | null;
  createdAt: T;
}

export interface UndeliveredList {
  mail: UndeliveredMail[];
}

export interface Done {
  ok: true;
}

export interface Unsubscribed {
  digest: false;
}
