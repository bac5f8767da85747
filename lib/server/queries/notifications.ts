import 'server-only';
import type { Db } from '@/lib/server/db';
import { DEFAULT_PREFERENCES, type NotificationKind, type Preferences } from '@/lib/validation/notification';

export async function getPreferences(db: Db, userId: string): Promise<Preferences> {
  const row = await db('notification_preferences').where({ user_id: userId }).first('assignment', 'comment', 'mention', 'overdue', 'digest');
  return row ? (row as Preferences) : { ...DEFAULT_PREFERENCES };
}

export async function savePreferences(db: Db, userId: string, prefs: Partial<Preferences>) {
  await db('notification_preferences')
    .insert({ ...DEFAULT_PREFERENCES, ...prefs, user_id: userId, updated_at: db.fn.now() })
    .onConflict('user_id')
    .merge([...(Object.keys(prefs) as (keyof Preferences)[]), 'updated_at']);
}

export interface Recipient {
  id: string;
  email: string;
  name: string | null;
}

/** Of these people, the current members of the organisation who want this kind of mail. */
export async function recipientsFor(db: Db, organisationId: string, userIds: string[], kind: NotificationKind): Promise<Recipient[]> {
  if (userIds.length === 0) return [];
  return db('users as u')
    .join('memberships as m', 'm.user_id', 'u.id')
    .leftJoin('notification_preferences as p', 'p.user_id', 'u.id')
    .where('m.organisation_id', organisationId)
    .whereIn('u.id', [...new Set(userIds)])
    .andWhereRaw(`coalesce(p.??, ?)`, [kind, DEFAULT_PREFERENCES[kind]])
    .select<Recipient[]>({ id: 'u.id', email: 'u.email', name: 'u.name' });
}

/** People who chose the daily digest and have no digest row for that day yet. */
export function digestCandidates(db: Db, day: string, limit = 200): Promise<Recipient[]> {
  return db('notification_preferences as p')
    .join('users as u', 'u.id', 'p.user_id')
    .where('p.digest', true)
    .whereExists(db('memberships as m').whereRaw('m.user_id = u.id'))
    .whereNotExists(db('mail_outbox as o').whereRaw(`o.dedupe_key = 'digest:' || u.id || ':' || ?`, [day]))
    .limit(limit)
    .select<Recipient[]>({ id: 'u.id', email: 'u.email', name: 'u.name' });
}

export interface DigestTask {
  id: string;
  title: string;
  organisationName: string;
  blockName: string;
  dueOn: string | null;
  overdue: boolean;
  vines: number;
  vinesDone: number;
}

export interface DigestComment {
  subject: string;
  subjectId: string;
  organisationName: string;
  authorName: string | null;
  body: string;
  mentioned: boolean;
}

/** What a digest tells: open tasks of the person, and comments since `since` on their things or mentioning them. */
export async function digestContent(db: Db, userId: string, since: Date, until: Date) {
  const tasks = await db
    .raw<{ rows: DigestTask[] }>(
      `select t.id, t.title, o.name as "organisationName", b.name as "blockName", to_char(t.due_on, 'YYYY-MM-DD') as "dueOn",
              (t.due_on < (now() at time zone 'utc')::date) as overdue,
              (select count(*)::int from task_items i where i.task_id = t.id) as vines,
              (select count(*)::int from task_items i where i.task_id = t.id and i.status = 'done') as "vinesDone"
         from tasks t
         join organisations o on o.id = t.organisation_id
         join blocks b on b.id = t.block_id
         join memberships m on m.organisation_id = t.organisation_id and m.user_id = t.assignee_id
        where t.assignee_id = ? and t.status = 'open'
        order by t.due_on nulls last
        limit 50`,
      [userId],
    )
    .then((r) => r.rows);
  const comments = await db
    .raw<{ rows: DigestComment[] }>(
      `select c.subject_kind as subject, c.subject_id as "subjectId", o.name as "organisationName",
              coalesce(u.name, u.email) as "authorName", c.body,
              exists (select 1 from comment_mentions cm where cm.comment_id = c.id and cm.user_id = ?) as mentioned
         from comments c
         join organisations o on o.id = c.organisation_id
         join memberships m on m.organisation_id = c.organisation_id and m.user_id = ?
         left join users u on u.id = c.author_id
        where c.created_at >= ? and c.created_at < ? and c.author_id is distinct from ?
          and (exists (select 1 from comment_mentions cm where cm.comment_id = c.id and cm.user_id = ?)
            or (c.subject_kind = 'observation' and exists (select 1 from observations ob where ob.id = c.subject_id and ob.recorded_by = ?))
            or (c.subject_kind = 'task' and exists (select 1 from tasks t where t.id = c.subject_id and (t.assignee_id = ? or t.created_by = ?)))
            or (c.subject_kind = 'vine' and exists (select 1 from flags f join vine_positions vp on vp.id = c.subject_id
                  where f.flagged_by = ? and f.status = 'open' and f.block_id = vp.block_id and f.row_number = vp.row_number
                    and vp.position between f.position and f.to_position)))
        order by c.created_at
        limit 50`,
      [userId, userId, since, until, userId, userId, userId, userId, userId, userId],
    )
    .then((r) => r.rows);
  return { tasks, comments };
}
