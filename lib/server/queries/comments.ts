import 'server-only';
import type { CommentView } from '@/lib/contracts/comments';
import type { Knex } from 'knex';
import type { Db } from '@/lib/server/db';
import type { CommentSubject } from '@/lib/validation/comment';

export async function insertComment(
  trx: Db,
  c: { organisationId: string; subject: CommentSubject; subjectId: string; positionId: string | null; body: string; authorId: string },
) {
  const [row] = await trx('comments')
    .insert({
      organisation_id: c.organisationId,
      subject_kind: c.subject,
      subject_id: c.subjectId,
      position_id: c.positionId,
      body: c.body,
      author_id: c.authorId,
    })
    .returning<{ id: string; created_at: Date }[]>(['id', 'created_at']);
  return row!;
}

export async function insertMentions(trx: Db, commentId: string, userIds: string[]) {
  if (userIds.length) await trx('comment_mentions').insert(userIds.map((user_id) => ({ comment_id: commentId, user_id })));
}

function commentQuery(db: Db, organisationId: string): Knex.QueryBuilder<object, CommentView<Date>[]> {
  return db('comments as c')
    .leftJoin('users as u', 'u.id', 'c.author_id')
    .where('c.organisation_id', organisationId)
    .orderBy([{ column: 'c.created_at' }, { column: 'c.id' }])
    .select({
      id: 'c.id',
      subject: 'c.subject_kind',
      subjectId: 'c.subject_id',
      body: 'c.body',
      authorId: 'c.author_id',
      authorName: db.raw('coalesce(u.name, u.email)'),
      createdAt: 'c.created_at',
    });
}

export function listComments(db: Db, organisationId: string, subject: CommentSubject, subjectId: string) {
  return commentQuery(db, organisationId).andWhere({ 'c.subject_kind': subject, 'c.subject_id': subjectId });
}

/** Comments on a vine itself and on its observations, oldest first. */
export function listCommentsOnVine(db: Db, organisationId: string, positionId: string) {
  return commentQuery(db, organisationId).andWhere('c.position_id', positionId);
}

/** How many comments each observation has, for the vine panel's per-finding threads. */
export async function countCommentsBySubject(db: Db, organisationId: string, subject: CommentSubject, ids: string[]) {
  if (ids.length === 0) return new Map<string, number>();
  const rows = await db('comments')
    .where({ organisation_id: organisationId, subject_kind: subject })
    .whereIn('subject_id', ids)
    .groupBy('subject_id')
    .select<{ subject_id: string; n: number }[]>('subject_id', db.raw('count(*)::int as n'));
  return new Map(rows.map((r) => [r.subject_id, r.n]));
}

/** Has this person written in the thread, or been mentioned in it? */
export async function isInThread(db: Db, organisationId: string, subject: CommentSubject, subjectId: string, userId: string) {
  const row = await db('comments as c')
    .leftJoin('comment_mentions as m', function () {
      this.on('m.comment_id', 'c.id').andOnVal('m.user_id', userId);
    })
    .where({ 'c.organisation_id': organisationId, 'c.subject_kind': subject, 'c.subject_id': subjectId })
    .andWhere((q) => q.where('c.author_id', userId).orWhereNotNull('m.user_id'))
    .first('c.id');
  return !!row;
}

export interface SubjectInfo {
  positionId: string | null;
  blockId: string;
  /** Who the subject belongs to: told of comments on it. */
  owners: string[];
  /** Everyone involved, who may comment besides managers and advisors. */
  involved: string[];
  title: string;
  row: number | null;
  position: number | null;
  /** Where a link in a mail should take the reader. */
  path: string;
}

/** What a comment hangs on, in this organisation only; undefined for another organisation's id. */
export async function getSubject(db: Db, organisationId: string, subject: CommentSubject, id: string): Promise<SubjectInfo | undefined> {
  if (subject === 'observation') {
    const o = await db('observations as o')
      .join('blocks as b', 'b.id', 'o.block_id')
      .where({ 'o.id': id, 'o.organisation_id': organisationId })
      .whereNull('o.deleted_at')
      .first<
        | { position_id: string; block_id: string; recorded_by: string | null; kind: string; row_number: number; position: number; block_name: string }
        | undefined
      >('o.position_id', 'o.block_id', 'o.recorded_by', 'o.kind', 'o.row_number', 'o.position', 'b.name as block_name');
    if (!o) return undefined;
    const owners = o.recorded_by ? [o.recorded_by] : [];
    return {
      positionId: o.position_id,
      blockId: o.block_id,
      owners,
      involved: owners,
      title: `${o.kind.replace(/-/g, ' ')} at ${o.block_name}, row ${o.row_number}, vine ${o.position}`,
      row: o.row_number,
      position: o.position,
      path: `/grid/${o.block_id}?row=${o.row_number}&position=${o.position}`,
    };
  }
  if (subject === 'vine') {
    const v = await db('vine_positions as vp')
      .join('blocks as b', 'b.id', 'vp.block_id')
      .where({ 'vp.id': id, 'b.organisation_id': organisationId })
      .first<{ block_id: string; row_number: number; position: number; block_name: string } | undefined>(
        'vp.block_id',
        'vp.row_number',
        'vp.position',
        'b.name as block_name',
      );
    if (!v) return undefined;
    const flaggers: string[] = await db('flags')
      .where({ organisation_id: organisationId, block_id: v.block_id, row_number: v.row_number, status: 'open' })
      .andWhere('position', '<=', v.position)
      .andWhere('to_position', '>=', v.position)
      .whereNotNull('flagged_by')
      .distinct()
      .pluck('flagged_by');
    const recorders: string[] = await db('observations')
      .where({ organisation_id: organisationId, position_id: id })
      .whereNotNull('recorded_by')
      .distinct()
      .pluck('recorded_by');
    const workers: string[] = await db('task_items as i')
      .join('tasks as t', 't.id', 'i.task_id')
      .where({ 'i.position_id': id, 't.organisation_id': organisationId })
      .whereNotNull('t.assignee_id')
      .distinct()
      .pluck('t.assignee_id');
    const flaggedBy = [...new Set(flaggers)];
    return {
      positionId: id,
      blockId: v.block_id,
      owners: flaggedBy,
      involved: [...new Set([...flaggedBy, ...recorders, ...workers])],
      title: `${v.block_name}, row ${v.row_number}, vine ${v.position}`,
      row: v.row_number,
      position: v.position,
      path: `/grid/${v.block_id}?row=${v.row_number}&position=${v.position}`,
    };
  }
  const t = await db('tasks')
    .where({ id, organisation_id: organisationId })
    .first<{ block_id: string; assignee_id: string | null; created_by: string | null; title: string } | undefined>(
      'block_id',
      'assignee_id',
      'created_by',
      'title',
    );
  if (!t) return undefined;
  const owners = [...new Set([t.assignee_id, t.created_by].filter((x): x is string => !!x))];
  return { positionId: null, blockId: t.block_id, owners, involved: owners, title: `task “${t.title}”`, row: null, position: null, path: `/tasks/${id}` };
}
