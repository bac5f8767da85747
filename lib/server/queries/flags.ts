import 'server-only';
import type { FlagView } from '@/lib/contracts/flags';
import type { Db } from '@/lib/server/db';
import type { FlagReason } from '@/lib/validation/flag';

export function getStoredFlagHashes(db: Db, ids: string[]) {
  if (ids.length === 0) return Promise.resolve([]);
  return db('flags').whereIn('id', ids).select<{ id: string; organisation_id: string; payload_sha256: string }[]>('id', 'organisation_id', 'payload_sha256');
}

export interface FlagCandidate {
  id: string;
  block_id: string;
  row_number: number;
  position: number;
  to_position: number;
  reason: FlagReason;
  note: string;
  flagged_at: string;
  payload_sha256: string;
}

export interface IngestOutcome {
  ord: number;
  inserted: boolean;
  storedOrg: string | null;
  storedHash: string | null;
}

export interface FlagOutcome extends IngestOutcome {
  blockOk: boolean;
  positionId: string | null;
  toOk: boolean;
}

/**
 * One statement per batch: ids stored before are answered from what is stored; the new ones are
 * checked against the member's blocks and vines (first and last vine of the span) and inserted
 * once by id. Rows another transaction stored meanwhile are not seen (the statement's snapshot).
 */
export async function ingestFlags(db: Db, organisationId: string, flaggedBy: string, records: FlagCandidate[]): Promise<FlagOutcome[]> {
  if (records.length === 0) return [];
  const { rows } = await db.raw<{ rows: FlagOutcome[] }>(
    `with input as (
       select * from jsonb_to_recordset(?::jsonb) as r(ord int, id uuid, block_id uuid, row_number int, "position" int, to_position int,
         reason text, note text, flagged_at timestamptz, payload_sha256 text)
     ), facts as (
       select i.*, b.id is not null as block_ok, p.id as position_id, last.id is not null as to_ok,
         s.organisation_id as stored_org, s.payload_sha256 as stored_hash
       from input i
       left join flags s on s.id = i.id
       left join blocks b on b.id = i.block_id and b.organisation_id = ?
       left join vine_positions p on p.block_id = b.id and p.row_number = i.row_number and p.position = i."position"
       left join vine_positions last on last.block_id = b.id and last.row_number = i.row_number and last.position = i.to_position
     ), ins as (
       insert into flags (id, organisation_id, block_id, position_id, row_number, position, to_position, reason, note, flagged_at, flagged_by, payload_sha256)
       select distinct on (id) id, ?::uuid, block_id, position_id, row_number, "position", to_position, reason, note, flagged_at, ?::uuid, payload_sha256
       from facts
       where stored_org is null and position_id is not null and to_ok
       order by id, ord
       on conflict (id) do nothing
       returning id
     )
     select f.ord, f.block_ok as "blockOk", f.position_id as "positionId", f.to_ok as "toOk",
       exists (select 1 from ins where ins.id = f.id) as inserted, f.stored_org as "storedOrg", f.stored_hash as "storedHash"
     from facts f
     order by f.ord`,
    [JSON.stringify(records.map((r, ord) => ({ ord, ...r }))), organisationId, organisationId, flaggedBy],
  );
  return rows;
}

function flagQuery(db: Db, organisationId: string) {
  return db('flags as f')
    .join('blocks as b', 'b.id', 'f.block_id')
    .leftJoin('users as u', 'u.id', 'f.flagged_by')
    .leftJoin('tasks as t', 't.id', 'f.task_id')
    .where('f.organisation_id', organisationId)
    .select({
      id: 'f.id',
      blockId: 'f.block_id',
      blockName: 'b.name',
      vinesPerPanel: 'b.vines_per_panel',
      row: 'f.row_number',
      position: 'f.position',
      toPosition: 'f.to_position',
      reason: 'f.reason',
      note: 'f.note',
      flaggedAt: 'f.flagged_at',
      flaggedBy: 'f.flagged_by',
      flaggedByName: db.raw('coalesce(u.name, u.email)'),
      status: 'f.status',
      closedAt: 'f.closed_at',
      taskId: 'f.task_id',
      taskTitle: 't.title',
      taskStatus: 't.status',
    });
}

export function listFlags(
  db: Db,
  organisationId: string,
  f: { block?: string; status: 'open' | 'closed' | 'all'; untasked: boolean },
  limit = 2000,
): Promise<FlagView<Date>[]> {
  const q = flagQuery(db, organisationId)
    .orderBy([{ column: 'b.name' }, { column: 'f.row_number' }, { column: 'f.position' }, { column: 'f.flagged_at' }])
    .limit(limit);
  if (f.block) q.andWhere('f.block_id', f.block);
  if (f.status !== 'all') q.andWhere('f.status', f.status);
  if (f.untasked) q.whereNull('f.task_id');
  return q;
}

export function getFlag(db: Db, organisationId: string, id: string): Promise<FlagView<Date> | undefined> {
  return flagQuery(db, organisationId).andWhere('f.id', id).first();
}

export async function setFlagStatus(db: Db, organisationId: string, id: string, status: 'open' | 'closed', by: string) {
  const [row] = await db('flags')
    .where({ id, organisation_id: organisationId })
    // Opened again, a flag is free to go into a new task.
    .update(status === 'closed' ? { status, closed_at: db.fn.now(), closed_by: by } : { status, closed_at: null, closed_by: null, task_id: null })
    .returning('id');
  return row as { id: string } | undefined;
}

/** The open flags among these ids, locked for the transaction that turns them into tasks. */
export function lockOpenFlags(trx: Db, organisationId: string, ids: string[]) {
  return trx('flags')
    .where({ organisation_id: organisationId, status: 'open' })
    .whereIn('id', ids)
    .orderBy(['block_id', 'row_number', 'position'])
    .forUpdate()
    .select<
      {
        id: string;
        block_id: string;
        row_number: number;
        position: number;
        to_position: number;
        reason: FlagReason;
        note: string;
        task_id: string | null;
        flagged_by: string | null;
      }[]
    >('id', 'block_id', 'row_number', 'position', 'to_position', 'reason', 'note', 'task_id', 'flagged_by');
}

export function attachFlagsToTask(trx: Db, flagIds: string[], taskId: string) {
  return trx('flags').whereIn('id', flagIds).update({ task_id: taskId });
}

/** A cancelled task gives its flags back to the open pool, so they can be tasked again. */
export function releaseTaskFlags(trx: Db, taskId: string) {
  return trx('flags').where({ task_id: taskId, status: 'open' }).update({ task_id: null });
}

export function closeTaskFlags(trx: Db, taskIds: string[], by: string) {
  if (taskIds.length === 0) return Promise.resolve(0);
  return trx('flags').whereIn('task_id', taskIds).andWhere('status', 'open').update({ status: 'closed', closed_at: trx.fn.now(), closed_by: by });
}

/** Vines covered by an open flag in one block, as SQL for the grid's "flagged only" filter. */
export function openFlagPositionsSql(organisationId: string, blockId: string) {
  return {
    sql: `select vp.id from flags f
      join vine_positions vp on vp.block_id = f.block_id and vp.row_number = f.row_number and vp.position between f.position and f.to_position
      where f.organisation_id = ? and f.block_id = ? and f.status = 'open'`,
    bindings: [organisationId, blockId] as unknown[],
  };
}

/** Flags covering one vine (open first, newest first), for the vine panel. */
export interface VineFlagRow {
  id: string;
  reason: FlagReason;
  note: string;
  status: 'open' | 'closed';
  position: number;
  toPosition: number;
  at: Date;
  by: string | null;
  taskId: string | null;
}

export function listFlagsOnVine(db: Db, organisationId: string, positionId: string): Promise<VineFlagRow[]> {
  return db('flags as f')
    .join('vine_positions as vp', function () {
      this.on('vp.block_id', 'f.block_id')
        .andOn('vp.row_number', 'f.row_number')
        .andOn('vp.position', '>=', 'f.position')
        .andOn('vp.position', '<=', 'f.to_position');
    })
    .leftJoin('users as u', 'u.id', 'f.flagged_by')
    .where({ 'f.organisation_id': organisationId, 'vp.id': positionId })
    .orderByRaw(`f.status = 'open' desc, f.flagged_at desc`)
    .select({
      id: 'f.id',
      reason: 'f.reason',
      note: 'f.note',
      status: 'f.status',
      position: 'f.position',
      toPosition: 'f.to_position',
      at: 'f.flagged_at',
      by: db.raw('coalesce(u.name, u.email)'),
      taskId: 'f.task_id',
    });
}

/** Which of these flags of the organisation exist at all (those a lock did not find were closed meanwhile). */
export function existingFlagIds(db: Db, organisationId: string, ids: string[]): Promise<string[]> {
  return db('flags').where({ organisation_id: organisationId }).whereIn('id', ids).pluck('id');
}
