import 'server-only';
import { createHmac, timingSafeEqual } from 'node:crypto';
import { envSetting, getEnv } from '@/lib/env';
import { escapeHtml } from '@/lib/html';
import type { Db } from '@/lib/server/db';
import { linkMail } from '@/lib/server/mail';
import { enqueueMail, type OutboxInsert } from '@/lib/server/queries/mail-outbox';
import { digestCandidates, digestContent, recipientsFor, type Recipient } from '@/lib/server/queries/notifications';
import { listOverdueTasks } from '@/lib/server/queries/tasks';
import type { CommentSubject } from '@/lib/validation/comment';

/**
 * Notification mail: what each one says, who gets it, and the daily schedule. Nothing here talks
 * SMTP: mail is written to the outbox table (in the caller's transaction where there is one) and
 * the worker (services/mail-worker.ts) sends it.
 */

const DIGEST_HOUR_UTC = envSetting('DIGEST_HOUR_UTC');

const base = () => getEnv().NEXTAUTH_URL.replace(/\/$/, '');
export const appLink = (path: string) => `${base()}${path}`;

/** A signed link key for turning the digest off without signing in; it does nothing else. */
export function unsubscribeToken(userId: string) {
  return `${userId}.${sign(userId)}`;
}

function sign(userId: string) {
  return createHmac('sha256', getEnv().NEXTAUTH_SECRET).update(`vineward-digest-unsubscribe:${userId}`).digest('base64url');
}

export function verifyUnsubscribeToken(token: string): string | null {
  const [userId, signature] = token.split('.');
  if (!userId || !signature || !/^[0-9a-f-]{36}$/.test(userId)) return null;
  const expected = Buffer.from(sign(userId));
  const given = Buffer.from(signature);
  return expected.length === given.length && timingSafeEqual(expected, given) ? userId : null;
}

interface Notice {
  to: Recipient;
  organisationId: string | null;
  kind: OutboxInsert['kind'];
  key: string;
  subject: string;
  intro: string;
  action: string;
  path: string;
  digest?: boolean;
}

/** Every mail: one paragraph, a link back into the app, and where to choose what mail comes. */
function render(n: Notice): OutboxInsert {
  const settings = appLink('/settings/notifications');
  const unsubscribe = n.digest ? appLink(`/unsubscribe?token=${encodeURIComponent(unsubscribeToken(n.to.id))}`) : undefined;
  const footer = {
    text: `Choose which mails you get: ${settings}${unsubscribe ? `\nStop the daily digest: ${unsubscribe}` : ''}`,
    html:
      `<p style="color:#555;font-size:13px"><a href="${escapeHtml(settings)}">Choose which mails you get</a>` +
      (unsubscribe ? ` · <a href="${escapeHtml(unsubscribe)}">Stop the daily digest</a>` : '') +
      '</p>',
  };
  const mail = linkMail({ to: n.to.email, subject: n.subject, intro: n.intro, action: n.action, url: appLink(n.path), footer });
  const headers: Record<string, string> = {};
  if (unsubscribe) {
    headers['List-Unsubscribe'] = `<${appLink(`/api/notifications/unsubscribe?token=${encodeURIComponent(unsubscribeToken(n.to.id))}`)}>`;
    headers['List-Unsubscribe-Post'] = 'List-Unsubscribe=One-Click';
  }
  return {
    organisation_id: n.organisationId,
    user_id: n.to.id,
    to_email: n.to.email,
    kind: n.kind,
    dedupe_key: n.key,
    subject: n.subject,
    text_body: mail.text,
    html_body: mail.html ?? '',
    headers,
  };
}

const who = (r: { name: string | null; email: string }) => r.name ?? r.email;

export async function queueAssignmentMail(
  trx: Db,
  o: {
    organisationId: string;
    task: { id: string; title: string; blockName: string; dueOn: string; priority: string; vines: number; note: string };
    assigneeId: string;
    assignedAt: Date;
    by: { userId: string; name: string | null; email: string };
  },
) {
  if (o.assigneeId === o.by.userId) return;
  const [to] = await recipientsFor(trx, o.organisationId, [o.assigneeId], 'assignment');
  if (!to) return;
  const t = o.task;
  await enqueueMail(trx, [
    render({
      to,
      organisationId: o.organisationId,
      kind: 'assignment',
      key: `assignment:${t.id}:${o.assigneeId}:${o.assignedAt.getTime()}`,
      subject: `New task for you: ${t.title}`,
      intro:
        `${who(o.by)} gave you the task “${t.title}” in ${t.blockName}: ${t.vines} ${t.vines === 1 ? 'vine' : 'vines'}, ` +
        `due ${t.dueOn}, ${t.priority} priority.${t.note ? ` Note: ${t.note}` : ''}`,
      action: 'Open my tasks',
      path: `/field/tasks?task=${t.id}`,
    }),
  ]);
}

const SUBJECT_WORDS: Record<CommentSubject, string> = { observation: 'finding', vine: 'flagged vine', task: 'task' };

/**
 * One mail per person per comment: a mention wins over "a comment on your finding or task", and
 * nobody is told of their own comment.
 */
export async function queueCommentMails(
  trx: Db,
  o: {
    organisationId: string;
    commentId: string;
    subject: CommentSubject;
    subjectTitle: string;
    path: string;
    body: string;
    owners: string[];
    mentioned: string[];
    by: { userId: string; name: string | null; email: string };
  },
) {
  const mentioned = o.mentioned.filter((id) => id !== o.by.userId);
  const owners = o.owners.filter((id) => id !== o.by.userId && !mentioned.includes(id));
  const excerpt = o.body.length > 600 ? `${o.body.slice(0, 600)}…` : o.body;
  const rows: OutboxInsert[] = [];
  for (const to of await recipientsFor(trx, o.organisationId, mentioned, 'mention')) {
    rows.push(
      render({
        to,
        organisationId: o.organisationId,
        kind: 'mention',
        key: `comment:${o.commentId}:${to.id}`,
        subject: `${who(o.by)} mentioned you on ${o.subjectTitle}`,
        intro: `${who(o.by)} mentioned you in a comment on ${o.subjectTitle}: “${excerpt}”`,
        action: 'Open the thread',
        path: o.path,
      }),
    );
  }
  for (const to of await recipientsFor(trx, o.organisationId, owners, 'comment')) {
    rows.push(
      render({
        to,
        organisationId: o.organisationId,
        kind: 'comment',
        key: `comment:${o.commentId}:${to.id}`,
        subject: `${who(o.by)} commented on your ${SUBJECT_WORDS[o.subject]}`,
        intro: `${who(o.by)} commented on ${o.subjectTitle}: “${excerpt}”`,
        action: 'Open the thread',
        path: o.path,
      }),
    );
  }
  await enqueueMail(trx, rows);
}

/** One notice per task and due date: a new due date after a change makes a new notice. */
export async function scheduleOverdueMails(db: Db) {
  const tasks = await listOverdueTasks(db);
  let queued = 0;
  for (const t of tasks) {
    const [to] = await recipientsFor(db, t.organisation_id, [t.assignee_id], 'overdue');
    const key = `overdue:${t.id}:${t.due_on}`;
    queued += await enqueueMail(db, [
      to
        ? render({
            to,
            organisationId: t.organisation_id,
            kind: 'overdue',
            key,
            subject: `Overdue: ${t.title}`,
            intro: `The task “${t.title}” in ${t.block_name} was due on ${t.due_on} and is not finished yet.`,
            action: 'Open the task',
            path: `/field/tasks?task=${t.id}`,
          })
        : // The person turned these off: remember the day so the check does not run again for it.
          {
            organisation_id: t.organisation_id,
            user_id: t.assignee_id,
            to_email: t.email,
            kind: 'overdue',
            dedupe_key: key,
            subject: '',
            text_body: '',
            html_body: '',
            status: 'skipped',
          },
    ]);
  }
  return queued;
}

/** The digest day due now: today once its hour has passed, else yesterday. */
export function digestDay(now: Date) {
  const day = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), DIGEST_HOUR_UTC));
  if (now < day) day.setUTCDate(day.getUTCDate() - 1);
  return { day: day.toISOString().slice(0, 10), until: day, since: new Date(day.getTime() - 24 * 3600 * 1000) };
}

/**
 * A digest per person who chose one, once a day (the dedupe key is person and day, so several
 * servers add it once). A day with nothing to tell is recorded as skipped, and no mail goes out.
 */
export async function scheduleDigests(db: Db, now = new Date()) {
  const { day, since, until } = digestDay(now);
  let queued = 0;
  for (const person of await digestCandidates(db, day)) {
    const { tasks, comments } = await digestContent(db, person.id, since, until);
    const key = `digest:${person.id}:${day}`;
    if (tasks.length === 0 && comments.length === 0) {
      await enqueueMail(db, [
        {
          organisation_id: null,
          user_id: person.id,
          to_email: person.email,
          kind: 'digest',
          dedupe_key: key,
          subject: '',
          text_body: '',
          html_body: '',
          status: 'skipped',
        },
      ]);
      continue;
    }
    const lines = [
      ...(tasks.length ? [`Your open tasks (${tasks.length}):`] : []),
      ...tasks.map(
        (t) =>
          `- ${t.title} (${t.organisationName}, ${t.blockName}): ${t.vinesDone}/${t.vines} vines done${t.dueOn ? `, due ${t.dueOn}` : ''}${t.overdue ? ', OVERDUE' : ''}`,
      ),
      ...(comments.length ? [`New comments for you (${comments.length}):`] : []),
      ...comments.map(
        (c) =>
          `- ${c.authorName ?? 'Someone'}${c.mentioned ? ' mentioned you' : ''} on a ${SUBJECT_WORDS[c.subject as CommentSubject] ?? c.subject} (${c.organisationName}): “${c.body.slice(0, 200)}”`,
      ),
    ];
    queued += await enqueueMail(db, [
      render({
        to: person,
        organisationId: null,
        kind: 'digest',
        key,
        subject: `Your Vineward digest for ${day}`,
        intro: lines.join('\n'),
        action: 'Open Vineward',
        path: '/tasks',
        digest: true,
      }),
    ]);
  }
  return queued;
}
