import 'server-only';
import type { Db } from '@/lib/server/db';

export interface ObservationCandidate {
  id: string;
  block_id: string;
  row_number: number;
  position: number;
  kind: string;
  data: unknown;
  note: string;
  observed_at: string;
  severity: number;
  payload_sha256: string;
}

/** What the database knows about one record of a batch, in the batch's order. */
export interface ObservationOutcome {
  ord: number;
  blockOk: boolean;
  positionOk: boolean;
  crewOk: boolean;
  inserted: boolean;
  storedOrg: string | null;
  storedHash: string | null;
}

/**
 * One statement per batch: resolves every address in the member's organisation, checks each
 * pruning check's pruner, inserts the records that pass once by id (the first of a repeated id),
 * and answers per record what it found, with the row stored before this statement (if any) for
 * telling a retry from a conflict. Rows another transaction stored meanwhile are not seen here
 * (the statement's snapshot): the caller looks those up.
 */
export async function ingestObservations(
  db: Db,
  organisationId: string,
  recordedBy: string,
  mayCheckPruning: boolean,
  records: ObservationCandidate[],
): Promise<ObservationOutcome[]> {
  if (records.length === 0) return [];
  const { rows } = await db.raw<{ rows: ObservationOutcome[] }>(
    `with input as (
       select * from jsonb_to_recordset(?::jsonb) as r(ord int, id uuid, block_id uuid, row_number int, "position" int, kind text,
         data jsonb, note text, observed_at timestamptz, severity smallint, payload_sha256 text)
     ), facts as (
       select i.*, b.id is not null as block_ok, p.id as position_id,
         (i.kind <> 'pruning-check' or exists (
           select 1 from memberships m where m.organisation_id = ? and m.user_id = (i.data->>'prunedBy')::uuid)) as crew_ok
       from input i
       left join blocks b on b.id = i.block_id and b.organisation_id = ?
       left join vine_positions p on p.block_id = b.id and p.row_number = i.row_number and p.position = i."position"
     ), ins as (
       insert into observations (id, organisation_id, block_id, position_id, row_number, position, kind, data, note, observed_at,
         recorded_by, severity, payload_sha256)
       select distinct on (id) id, ?::uuid, block_id, position_id, row_number, "position", kind, data, note, observed_at, ?::uuid, severity, payload_sha256
       from facts
       where position_id is not null and (kind <> 'pruning-check' or (?::boolean and crew_ok))
       order by id, ord
       on conflict (id) do nothing
       returning id
     )
     select f.ord, f.block_ok as "blockOk", f.position_id is not null as "positionOk", f.crew_ok as "crewOk",
       exists (select 1 from ins where ins.id = f.id) as inserted,
       o.organisation_id as "storedOrg", o.payload_sha256 as "storedHash"
     from facts f left join observations o on o.id = f.id
     order by f.ord`,
    [JSON.stringify(records.map((r, ord) => ({ ord, ...r }))), organisationId, organisationId, organisationId, recordedBy, mayCheckPruning],
  );
  return rows;
}

export async function getStoredHashes(db: Db, ids: string[]) {
  if (ids.length === 0) return [];
  return db('observations')
    .whereIn('id', ids)
    .select<{ id: string; organisation_id: string; payload_sha256: string }[]>('id', 'organisation_id', 'payload_sha256');
}

export function getObservation(db: Db, organisationId: string, id: string) {
  return db('observations').where({ id, organisation_id: organisationId }).whereNull('deleted_at').first();
}
