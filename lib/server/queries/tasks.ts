import 'server-only';
import type { BlockTaskProgress, TaskItemView, TaskView } from '@/lib/contracts/tasks';
import type { Role } from '@/lib/roles';
import type { Db } from '@/lib/server/db';
import type { TaskPriority, TaskStatus } from '@/lib/validation/task';

/** The ids among these that belong to members of the organisation. */
export async function memberIdsAmong(db: Db, organisationId: string, userIds: string[]) {
  if (userIds.length === 0) return new Set<string>();
  const ids = await db('memberships')
    .where({ organisation_id: organisationId })
    .whereIn('user_id', [...new Set(userIds)])
    .pluck('user_id');
  return new Set<string>(ids);
}

export function getMembership(db: Db, organisationId: string, userId: string) {
  return db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.organisation_id': organisationId, 'm.user_id': userId })
    .first<{ userId: string; email: string; name: string | null; role: Role } | undefined>({
      userId: 'u.id',
      email: 'u.email',
      name: 'u.name',
      role: 'm.role',
    });
}

export interface TaskInsert {
  organisation_id: string;
  block_id: string;
  title: string;
  note: string;
  assignee_id: string;
  due_on: string;
  priority: TaskPriority;
  created_by: string;
}

export async function insertTask(trx: Db, task: TaskInsert) {
  const [row] = await trx('tasks')
    .insert({ ...task, assigned_at: trx.fn.now() })
    .returning<{ id: string; assigned_at: Date }[]>(['id', 'assigned_at']);
  return row!;
}

export interface TaskItemInsert {
  task_id: string;
  position_id: string;
  row_number: number;
  position: number;
  sequence: number;
}

export async function insertTaskItems(trx: Db, items: TaskItemInsert[]) {
  for (let i = 0; i < items.length; i += 1000) await trx('task_items').insert(items.slice(i, i + 1000));
}

/** The planting slots of a row between two positions, to expand flags into vines. */
export function slotsInRuns(trx: Db, blockId: string, runs: { row: number; from: number; to: number }[]) {
  if (runs.length === 0) return Promise.resolve([]);
  return trx
    .raw<{ rows: { id: string; row_number: number; position: number }[] }>(
      `select distinct vp.id, vp.row_number, vp.position
         from unnest(?::int[], ?::int[], ?::int[]) as r(row_number, first, last)
         join vine_positions vp on vp.block_id = ? and vp.row_number = r.row_number and vp.position between r.first and r.last
        order by vp.row_number, vp.position`,
      [runs.map((r) => r.row), runs.map((r) => r.from), runs.map((r) => r.to), blockId],
    )
    .then((r) => r.rows);
}

function taskQuery(db: Db, organisationId: string) {
  return db('tasks as t')
    .join('blocks as b', 'b.id', 't.block_id')
    .leftJoin('users as a', 'a.id', 't.assignee_id')
    .leftJoin('users as c', 'c.id', 't.created_by')
    .leftJoin(
      db('task_items')
        .groupBy('task_id')
        .select('task_id', db.raw('count(*)::int as vines'), db.raw(`count(*) filter (where status = 'done')::int as done`))
        .as('p'),
      'p.task_id',
      't.id',
    )
    .where('t.organisation_id', organisationId)
    .select({
      id: 't.id',
      blockId: 't.block_id',
      blockName: 'b.name',
      vinesPerPanel: 'b.vines_per_panel',
      title: 't.title',
      note: 't.note',
      assigneeId: 't.assignee_id',
      assigneeName: db.raw('coalesce(a.name, a.email)'),
      assignedAt: 't.assigned_at',
      dueOn: db.raw(`to_char(t.due_on, 'YYYY-MM-DD')`),
      priority: 't.priority',
      status: 't.status',
      createdBy: 't.created_by',
      createdByName: db.raw('coalesce(c.name, c.email)'),
      createdAt: 't.created_at',
      closedAt: 't.closed_at',
      vines: db.raw('coalesce(p.vines, 0)'),
      vinesDone: db.raw('coalesce(p.done, 0)'),
      overdue: db.raw(`(t.status = 'open' and t.due_on < (now() at time zone 'utc')::date)`),
    });
}

export function listTasks(
  db: Db,
  organisationId: string,
  f: { status: TaskStatus | 'all'; assigneeId?: string; block?: string; priority?: TaskPriority; overdue?: boolean },
  limit = 1000,
): Promise<TaskView<Date>[]> {
  const q = taskQuery(db, organisationId)
    .orderByRaw(`t.due_on nulls last, case t.priority when 'high' then 0 when 'normal' then 1 else 2 end, t.created_at`)
    .limit(limit);
  if (f.status !== 'all') q.andWhere('t.status', f.status);
  if (f.assigneeId) q.andWhere('t.assignee_id', f.assigneeId);
  if (f.block) q.andWhere('t.block_id', f.block);
  if (f.priority) q.andWhere('t.priority', f.priority);
  // The same rule as the `overdue` column: open, and due before today in UTC.
  if (f.overdue) q.andWhere('t.status', 'open').andWhereRaw(`t.due_on < (now() at time zone 'utc')::date`);
  return q;
}

export function getTask(db: Db, organisationId: string, id: string): Promise<TaskView<Date> | undefined> {
  return taskQuery(db, organisationId).andWhere('t.id', id).first();
}

export function listTaskItems(db: Db, taskIds: string[]): Promise<TaskItemView<Date>[]> {
  if (taskIds.length === 0) return Promise.resolve([]);
  return db('task_items as i')
    .leftJoin('users as u', 'u.id', 'i.done_by')
    .whereIn('i.task_id', taskIds)
    .orderBy([{ column: 'i.task_id' }, { column: 'i.sequence' }])
    .select({
      taskId: 'i.task_id',
      positionId: 'i.position_id',
      row: 'i.row_number',
      position: 'i.position',
      sequence: 'i.sequence',
      status: 'i.status',
      doneAt: 'i.done_at',
      doneByName: db.raw('coalesce(u.name, u.email)'),
      note: 'i.note',
      observationId: 'i.observation_id',
      flags: db.raw(`coalesce((select json_agg(json_build_object('id', f.id, 'reason', f.reason, 'note', f.note) order by f.flagged_at)
        from flags f join tasks t on t.id = i.task_id
        where f.task_id = i.task_id and f.block_id = t.block_id and f.row_number = i.row_number
          and i.position between f.position and f.to_position), '[]'::json)`),
    });
}

export function lockTask(trx: Db, organisationId: string, id: string) {
  return trx('tasks')
    .where({ id, organisation_id: organisationId })
    .forUpdate()
    .first<{ id: string; block_id: string; status: TaskStatus; assignee_id: string | null; created_by: string | null; title: string } | undefined>(
      'id',
      'block_id',
      'status',
      'assignee_id',
      'created_by',
      'title',
    );
}

export async function updateTaskRow(trx: Db, id: string, patch: Partial<{ assignee_id: string; due_on: string; priority: TaskPriority; status: TaskStatus }>) {
  const changes: Record<string, unknown> = { ...patch, updated_at: trx.fn.now() };
  if (patch.assignee_id) changes.assigned_at = trx.fn.now();
  if (patch.status && patch.status !== 'open') changes.closed_at = trx.fn.now();
  const [row] = await trx('tasks').where({ id }).update(changes).returning<{ id: string; assigned_at: Date }[]>(['id', 'assigned_at']);
  return row!;
}

export interface TaskUpdateCandidate {
  id: string;
  task_id: string;
  block_id: string;
  row_number: number;
  position: number;
  note: string;
  observation_id: string | null;
  done_at: string;
  payload_sha256: string;
}

export interface TaskUpdateOutcome {
  ord: number;
  inserted: boolean;
  storedOrg: string | null;
  storedHash: string | null;
  taskFound: boolean;
  taskBlockId: string | null;
  taskStatus: TaskStatus | null;
  assigneeId: string | null;
  itemFound: boolean;
  /** The task this record checked a vine off in, when it was stored now. */
  taskId: string;
}

/**
 * One statement per batch: ids stored before are answered from what is stored; the new ones are
 * checked (the organisation's task, its block, a vine of it, not cancelled, the member's to do),
 * inserted once by id, and check their vines off (the first record of a vine in the batch wins; a
 * vine done before stays as it was). Closing finished tasks is the caller's next statement: this
 * one's snapshot does not see its own item updates.
 */
export async function ingestTaskUpdates(
  trx: Db,
  organisationId: string,
  member: { userId: string; mayDoAnyTask: boolean },
  records: TaskUpdateCandidate[],
): Promise<TaskUpdateOutcome[]> {
  if (records.length === 0) return [];
  const { rows } = await trx.raw<{ rows: TaskUpdateOutcome[] }>(
    `with input as (
       select * from jsonb_to_recordset(?::jsonb) as r(ord int, id uuid, task_id uuid, block_id uuid, row_number int, "position" int,
         note text, observation_id uuid, done_at timestamptz, payload_sha256 text)
     ), facts as (
       select i.*, t.id as found_task, t.block_id as task_block, t.status as task_status, t.assignee_id, ti.position_id,
         s.organisation_id as stored_org, s.payload_sha256 as stored_hash
       from input i
       left join task_updates s on s.id = i.id
       left join tasks t on t.id = i.task_id and t.organisation_id = ?
       left join task_items ti on ti.task_id = t.id and ti.row_number = i.row_number and ti.position = i."position"
     ), ins as (
       insert into task_updates (id, organisation_id, task_id, position_id, note, observation_id, done_at, recorded_by, payload_sha256)
       select distinct on (id) id, ?::uuid, task_id, position_id, note, observation_id, done_at, ?::uuid, payload_sha256
       from facts
       where stored_org is null and found_task is not null and task_block = block_id and position_id is not null
         and task_status <> 'cancelled' and (assignee_id = ?::uuid or ?::boolean)
       order by id, ord
       on conflict (id) do nothing
       returning id, task_id, position_id, note, observation_id, done_at
     ), first_per_vine as (
       select distinct on (ins.task_id, ins.position_id) ins.*
       from ins join (select id, min(ord) as ord from facts group by id) o on o.id = ins.id
       order by ins.task_id, ins.position_id, o.ord
     ), done as (
       update task_items ti set status = 'done', done_at = v.done_at, done_by = ?::uuid, note = v.note, observation_id = v.observation_id
       from first_per_vine v
       where ti.task_id = v.task_id and ti.position_id = v.position_id and ti.status = 'open'
       returning ti.task_id
     )
     select f.ord, exists (select 1 from ins where ins.id = f.id) as inserted, f.stored_org as "storedOrg", f.stored_hash as "storedHash",
       f.found_task is not null as "taskFound", f.task_block as "taskBlockId", f.task_status as "taskStatus", f.assignee_id as "assigneeId",
       f.position_id is not null as "itemFound", f.task_id as "taskId"
     from facts f
     order by f.ord`,
    [
      JSON.stringify(records.map((r, ord) => ({ ord, ...r }))),
      organisationId,
      organisationId,
      member.userId,
      member.userId,
      member.mayDoAnyTask,
      member.userId,
    ],
  );
  return rows;
}

export function getStoredTaskUpdateHashes(db: Db, ids: string[]) {
  if (ids.length === 0) return Promise.resolve([]);
  return db('task_updates')
    .whereIn('id', ids)
    .select<{ id: string; organisation_id: string; payload_sha256: string }[]>('id', 'organisation_id', 'payload_sha256');
}

/** Marks done the open tasks among these whose every vine is done; answers those it closed. */
export async function completeFinishedTasks(trx: Db, taskIds: string[]) {
  if (taskIds.length === 0) return [];
  const result = await trx.raw<{ rows: { id: string }[] }>(
    `update tasks t set status = 'done', closed_at = now(), updated_at = now()
      where t.id = any(?::uuid[]) and t.status = 'open'
        and not exists (select 1 from task_items i where i.task_id = t.id and i.status = 'open')
      returning t.id`,
    [[...new Set(taskIds)]],
  );
  return result.rows.map((r) => r.id);
}

/** Per block: open tasks, how many are overdue, and their vines done so far. */
export function blockProgress(db: Db, organisationId: string): Promise<BlockTaskProgress[]> {
  return db
    .raw<{ rows: BlockTaskProgress[] }>(
      `select b.id as "blockId", b.name as "blockName",
              count(distinct t.id)::int as "openTasks",
              count(distinct t.id) filter (where t.due_on < (now() at time zone 'utc')::date)::int as "overdueTasks",
              count(i.*)::int as vines,
              count(i.*) filter (where i.status = 'done')::int as "vinesDone"
         from tasks t
         join blocks b on b.id = t.block_id
         left join task_items i on i.task_id = t.id
        where t.organisation_id = ? and t.status = 'open'
        group by b.id, b.name
        order by b.name`,
      [organisationId],
    )
    .then((r) => r.rows);
}

/** Open tasks past their due date, across organisations, with their assignee: for the overdue notices. */
export interface OverdueTask {
  id: string;
  organisation_id: string;
  title: string;
  due_on: string;
  assignee_id: string;
  email: string;
  name: string | null;
  block_name: string;
}

export function listOverdueTasks(db: Db, limit = 500): Promise<OverdueTask[]> {
  return db('tasks as t')
    .join('users as u', 'u.id', 't.assignee_id')
    .join('memberships as m', function () {
      this.on('m.user_id', 't.assignee_id').andOn('m.organisation_id', 't.organisation_id');
    })
    .join('blocks as b', 'b.id', 't.block_id')
    .where('t.status', 'open')
    .andWhereRaw(`t.due_on < (now() at time zone 'utc')::date`)
    .whereNotExists(db('mail_outbox as o').whereRaw(`o.dedupe_key = 'overdue:' || t.id || ':' || to_char(t.due_on, 'YYYY-MM-DD')`))
    .limit(limit)
    .select({
      id: 't.id',
      organisation_id: 't.organisation_id',
      title: 't.title',
      due_on: db.raw(`to_char(t.due_on, 'YYYY-MM-DD')`),
      assignee_id: 't.assignee_id',
      email: 'u.email',
      name: 'u.name',
      block_name: 'b.name',
    });
}

export interface PruningCheckRow {
  id: string;
  blockId: string;
  blockName: string;
  trainingSystem: string;
  positionId: string;
  row: number;
  position: number;
  data: { prunedBy: string; canesKept: number; budsOnCanes: number; renewalSpurs: number; budTarget?: number };
  observedAt: Date;
  checkedByName: string | null;
  prunerName: string | null;
}

/** Pruning checks of the organisation, newest first, with the pruner each one checked. */
export function listPruningChecks(db: Db, organisationId: string, f: { block?: string; from?: string; to?: string }, limit = 5000): Promise<PruningCheckRow[]> {
  const q = db('observations as o')
    .join('blocks as b', 'b.id', 'o.block_id')
    .leftJoin('users as c', 'c.id', 'o.recorded_by')
    .leftJoin('users as p', db.raw(`p.id::text = o.data->>'prunedBy'`))
    .where({ 'o.organisation_id': organisationId, 'o.kind': 'pruning-check' })
    .whereNull('o.deleted_at')
    .orderBy('o.observed_at', 'desc')
    .limit(limit)
    .select({
      id: 'o.id',
      blockId: 'o.block_id',
      blockName: 'b.name',
      trainingSystem: 'b.training_system',
      positionId: 'o.position_id',
      row: 'o.row_number',
      position: 'o.position',
      data: 'o.data',
      observedAt: 'o.observed_at',
      checkedByName: db.raw('coalesce(c.name, c.email)'),
      prunerName: db.raw('coalesce(p.name, p.email)'),
    });
  if (f.block) q.andWhere('o.block_id', f.block);
  if (f.from) q.andWhere('o.observed_at', '>=', `${f.from}T00:00:00Z`);
  if (f.to) q.andWhereRaw(`o.observed_at < (?::date + 1)`, [f.to]);
  return q;
}

/** The measurements a vine's pruning plan is made from, for many vines at once. */
export function listPlanMeasurements(db: Db, organisationId: string, positionIds: string[]) {
  if (positionIds.length === 0) return Promise.resolve([]);
  return db('observations')
    .where({ organisation_id: organisationId })
    .whereIn('position_id', [...new Set(positionIds)])
    .whereIn('kind', ['cane-diameter', 'shade-cane', 'pruning-record'])
    .whereNull('deleted_at')
    .select<{ positionId: string; kind: string; data: Record<string, unknown>; observedAt: Date }[]>({
      positionId: 'position_id',
      kind: 'kind',
      data: 'data',
      observedAt: 'observed_at',
    });
}
