import 'server-only';
import { envSetting, getEnv } from '@/lib/env';
import { db } from '@/lib/server/db';
import { sendMail } from '@/lib/server/mail';
import { claimDueMail, markMailFailed, markMailRetry, markMailSent, markStaleSendingUncertain, type OutboxRow } from '@/lib/server/queries/mail-outbox';
import { scheduleDigests, scheduleOverdueMails } from '@/lib/server/services/notifications';

/**
 * Drains the mail outbox, in every app server. Rows are claimed with FOR UPDATE SKIP LOCKED and
 * marked "sending" (committed) before the SMTP call, then "sent" after it, so two servers never
 * send the same row. A failed call goes back to "queued" with exponential back-off; nothing is
 * dropped while the mail server is down.
 *
 * The crash window: if a server dies after the SMTP server took a mail but before the row says
 * "sent", we cannot know whether it went. We choose never to send twice: a row left "sending"
 * past the lease becomes "uncertain" and is not resent by itself (it stays in the table for a
 * person to check). Every mail carries a Message-ID made from its row id, so a resend done by
 * hand can be recognised as a repeat by the receiving side.
 *
 * The same loop adds the overdue notices and the daily digests (idempotent by their dedupe keys).
 */

const POLL_MS = envSetting('MAIL_POLL_MS');
const SCHEDULE_MS = envSetting('MAIL_SCHEDULE_MS');
// Longer than nodemailer's own connection, greeting and socket timeouts together.
const LEASE_MS = 30 * 60_000;
const BATCH = 20;
const BACKOFF_BASE_MS = 5000;
const BACKOFF_MAX_MS = 30 * 60_000;
// A mail server that rejects a message outright (5xx) gets a few more tries, then the row is failed.
const PERMANENT_TRIES = 3;

interface WorkerState {
  started: boolean;
  running: boolean;
  again: boolean;
  scheduleNow: boolean;
  lastSchedule: number;
  wake: (o?: { schedule?: boolean }) => void;
}

// One worker per process, shared by the instrumentation bundle and the route handlers' bundle.
const store = globalThis as unknown as { vinewardMailWorker?: WorkerState };

export function backoffMs(attempts: number) {
  const delay = Math.min(BACKOFF_MAX_MS, BACKOFF_BASE_MS * 2 ** Math.max(0, attempts - 1));
  return Math.round(delay * (0.8 + Math.random() * 0.4));
}

function messageId(id: string) {
  return `<${id}@${new URL(getEnv().NEXTAUTH_URL).hostname}>`;
}

async function deliver(row: OutboxRow) {
  try {
    await sendMail({
      to: row.to_email,
      subject: row.subject,
      text: row.text_body,
      html: row.html_body,
      messageId: messageId(row.id),
      headers: row.headers,
    });
  } catch (err) {
    const e = err as { message?: string; responseCode?: number };
    const message = e.message ?? String(err);
    if (e.responseCode && e.responseCode >= 500 && row.attempts >= PERMANENT_TRIES) await markMailFailed(db(), row.id, message);
    else await markMailRetry(db(), row.id, message, backoffMs(row.attempts));
    return false;
  }
  await markMailSent(db(), row.id);
  return true;
}

async function tick(state: WorkerState) {
  if (state.running) {
    state.again = true;
    return;
  }
  state.running = true;
  try {
    const stale = await markStaleSendingUncertain(db(), LEASE_MS);
    for (const s of stale) console.error(`Mail ${s.id} to ${s.to_email} (“${s.subject}”) was interrupted mid-send; marked uncertain, not resent.`);
    if (state.scheduleNow || Date.now() - state.lastSchedule >= SCHEDULE_MS) {
      state.scheduleNow = false;
      state.lastSchedule = Date.now();
      await scheduleOverdueMails(db());
      await scheduleDigests(db());
    }
    for (;;) {
      const batch = await claimDueMail(db(), BATCH);
      let failed = 0;
      for (const row of batch) if (!(await deliver(row))) failed++;
      // A failing mail server fails the whole batch: wait for the next due time rather than hammer it.
      if (batch.length < BATCH || failed > 0) break;
    }
  } catch (err) {
    console.error('The mail worker could not finish a round; it tries again shortly.', err);
  } finally {
    state.running = false;
    if (state.again) {
      state.again = false;
      setImmediate(() => void tick(state));
    }
  }
}

/** Starts the loop once per process. Safe on any number of servers at once. */
export function startMailWorker() {
  if (store.vinewardMailWorker?.started) return;
  const state: WorkerState = {
    started: true,
    running: false,
    again: false,
    scheduleNow: true,
    lastSchedule: 0,
    wake: (o) => {
      if (o?.schedule) state.scheduleNow = true;
      void tick(state);
    },
  };
  store.vinewardMailWorker = state;
  setInterval(() => void tick(state), POLL_MS).unref();
  void tick(state);
}

/** After a commit that queued mail: send it now rather than at the next poll. Other servers poll. */
export function wakeMailWorker(o?: { schedule?: boolean }) {
  if (!store.vinewardMailWorker) startMailWorker();
  store.vinewardMailWorker!.wake(o);
}
