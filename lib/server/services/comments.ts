import 'server-only';
import type { Member } from '@/lib/server/auth/guard';
import { db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { getSubject, insertComment, insertMentions, isInThread, listComments } from '@/lib/server/queries/comments';
import { listMembers } from '@/lib/server/queries/organisations';
import { wakeMailWorker } from '@/lib/server/services/mail-worker';
import { queueCommentMails } from '@/lib/server/services/notifications';
import { findMentions, type CommentInput, type CommentSubject } from '@/lib/validation/comment';

async function subjectOrNotFound(member: Member, subject: CommentSubject, id: string) {
  const info = await getSubject(db(), member.organisationId, subject, id);
  if (!info) throw new AppError('not-found', `No such ${subject} in your organisation.`);
  return info;
}

export async function listThread(member: Member, subject: CommentSubject, id: string) {
  await subjectOrNotFound(member, subject, id);
  return listComments(db(), member.organisationId, subject, id);
}

/**
 * Managers and advisors comment anywhere in their organisation; scouts and pruners where they are
 * involved: their own finding or flag, a vine they recorded or work on, their task, or a thread they
 * are already in. The comment and its mails are written in one transaction.
 */
export async function addComment(member: Member, input: CommentInput) {
  const info = await subjectOrNotFound(member, input.subject, input.subjectId);
  if (member.role !== 'manager' && member.role !== 'advisor') {
    const involved = info.involved.includes(member.userId) || (await isInThread(db(), member.organisationId, input.subject, input.subjectId, member.userId));
    if (!involved) throw new AppError('forbidden', 'Only managers, advisors and the people involved can comment here.');
  }
  const members = await listMembers(db(), member.organisationId);
  const mentioned = findMentions(input.body, members);
  const comment = await db().transaction(async (trx) => {
    const row = await insertComment(trx, {
      organisationId: member.organisationId,
      subject: input.subject,
      subjectId: input.subjectId,
      positionId: info.positionId,
      body: input.body,
      authorId: member.userId,
    });
    await insertMentions(trx, row.id, mentioned);
    await queueCommentMails(trx, {
      organisationId: member.organisationId,
      commentId: row.id,
      subject: input.subject,
      subjectTitle: info.title,
      path: info.path,
      body: input.body,
      owners: info.owners,
      mentioned,
      by: member,
    });
    return row;
  });
  wakeMailWorker();
  return {
    id: comment.id,
    subject: input.subject,
    subjectId: input.subjectId,
    body: input.body,
    authorId: member.userId,
    authorName: member.name ?? member.email,
    createdAt: comment.created_at,
    mentions: mentioned,
  };
}
