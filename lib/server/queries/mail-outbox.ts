import 'server-only';
import type { UndeliveredMail } from '@/lib/contracts/notifications';
import type { Db } from '@/lib/server/db';
import type { NotificationKind } from '@/lib/validation/notification';

export interface OutboxInsert {
  organisation_id: string | null;
  user_id: string | null;
  to_email: string;
  kind: NotificationKind;
  dedupe_key: string;
  subject: string;
  text_body: string;
  html_body: string;
  headers?: Record<string, string>;
  status?: 'queued' | 'skipped';
}

/** Adds mail once per dedupe key, whatever server or retry adds it; answers how many were new. */
export async function enqueueMail(db: Db, rows: OutboxInsert[]) {
  if (rows.length === 0) return 0;
  const inserted = await db('mail_outbox')
    .insert(rows.map((r) => ({ ...r, headers: JSON.stringify(r.headers ?? {}) })))
    .onConflict('dedupe_key')
    .ignore()
    .returning('id');
  return inserted.length;
}

export interface OutboxRow {
  id: string;
  to_email: string;
  subject: string;
  text_body: string;
  html_body: string;
  headers: Record<string, string>;
  attempts: number;
}

/**
 * Claims due mail for this worker and marks it "sending" in one committed statement, so no other
 * worker can pick it up while the SMTP call runs.
 */
export async function claimDueMail(db: Db, limit: number): Promise<OutboxRow[]> {
  const result = await db.raw<{ rows: OutboxRow[] }>(
    `update mail_outbox o set status = 'sending', attempts = o.attempts + 1, claimed_at = now()
      where o.id in (select id from mail_outbox where status = 'queued' and next_attempt_at <= now()
                      order by next_attempt_at limit ? for update skip locked)
      returning o.id, o.to_email, o.subject, o.text_body, o.html_body, o.headers, o.attempts`,
    [limit],
  );
  return result.rows;
}

export function markMailSent(db: Db, id: string) {
  return db('mail_outbox').where({ id, status: 'sending' }).update({ status: 'sent', sent_at: db.fn.now(), last_error: null });
}

export function markMailRetry(db: Db, id: string, error: string, delayMs: number) {
  return db('mail_outbox')
    .where({ id, status: 'sending' })
    .update({ status: 'queued', last_error: error.slice(0, 1000), next_attempt_at: db.raw(`now() + (? * interval '1 millisecond')`, [delayMs]) });
}

export function markMailFailed(db: Db, id: string, error: string) {
  return db('mail_outbox')
    .where({ id, status: 'sending' })
    .update({ status: 'failed', last_error: error.slice(0, 1000) });
}

/**
 * Mail left "sending" longer than the lease belongs to a worker that died mid-send: the SMTP server
 * may or may not have taken it. It becomes "uncertain" and is never sent again by itself.
 */
export function markStaleSendingUncertain(db: Db, leaseMs: number) {
  return db('mail_outbox')
    .where('status', 'sending')
    .andWhereRaw(`claimed_at < now() - (? * interval '1 millisecond')`, [leaseMs])
    .update({ status: 'uncertain', last_error: 'The worker stopped during the SMTP call; not resent, to never send twice.' })
    .returning<{ id: string; to_email: string; subject: string }[]>(['id', 'to_email', 'subject']);
}

/** The organisation's mail that failed for good or may not have arrived, newest first. */
export function listUndeliveredMail(db: Db, organisationId: string, limit = 100): Promise<UndeliveredMail<Date>[]> {
  return db('mail_outbox')
    .where({ organisation_id: organisationId })
    .whereIn('status', ['failed', 'uncertain'])
    .orderBy([
      { column: 'created_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ])
    .limit(limit)
    .select({
      id: 'id',
      toEmail: 'to_email',
      kind: 'kind',
      subject: 'subject',
      status: 'status',
      attempts: 'attempts',
      lastError: 'last_error',
      createdAt: 'created_at',
    });
}

/** Queues one such mail again (a fresh round of attempts); answers whether there was one. */
export async function requeueUndeliveredMail(db: Db, organisationId: string, id: string) {
  const changed = await db('mail_outbox')
    .where({ id, organisation_id: organisationId })
    .whereIn('status', ['failed', 'uncertain'])
    .update({ status: 'queued', attempts: 0, next_attempt_at: db.fn.now(), claimed_at: null });
  return changed > 0;
}

/** Takes one such mail off the list for good; answers whether there was one. */
export async function dismissUndeliveredMail(db: Db, organisationId: string, id: string, by: string) {
  const changed = await db('mail_outbox')
    .where({ id, organisation_id: organisationId })
    .whereIn('status', ['failed', 'uncertain'])
    .update({ status: 'dismissed', dismissed_by: by, dismissed_at: db.fn.now() });
  return changed > 0;
}
