import 'server-only';
import type { Db } from '@/lib/server/db';

/**
 * Everything the phone needs to walk a block offline, compact: one status letter per slot per row
 * (P planted, M missing, D dead, R replant) and the worst open finding of each vine that has one.
 */
export async function getFieldLayout(db: Db, blockId: string) {
  const rows = await db.raw<{ rows: { row_number: number; vine_count: number; statuses: string }[] }>(
    `select r.row_number, r.vine_count,
            string_agg(case p.status when 'planted' then 'P' when 'missing' then 'M' when 'dead' then 'D' else 'R' end, '' order by p.position) as statuses
       from block_rows r
       join vine_positions p on p.block_id = r.block_id and p.row_number = r.row_number
      where r.block_id = ?
      group by r.row_number, r.vine_count
      order by r.row_number`,
    [blockId],
  );
  const findings = await db.raw<{ rows: { row_number: number; position: number; severity: number; open: number }[] }>(
    `select row_number, position, max(severity)::int as severity, count(*)::int as open
       from observations
      where block_id = ? and status = 'open' and deleted_at is null and severity > 0
      group by row_number, position`,
    [blockId],
  );
  return {
    rows: rows.rows.map((r) => ({ row: r.row_number, vineCount: r.vine_count, statuses: r.statuses })),
    findings: findings.rows.map((f) => [f.row_number, f.position, f.severity, f.open] as [number, number, number, number]),
  };
}

/** The observations of one vine, newest first, for the stepper's "what is known here" list. */
export function listVineObservations(db: Db, blockId: string, row: number, position: number, limit = 20) {
  return db('observations as o')
    .leftJoin('users as u', 'u.id', 'o.recorded_by')
    .where({ 'o.block_id': blockId, 'o.row_number': row, 'o.position': position })
    .whereNull('o.deleted_at')
    .orderBy('o.observed_at', 'desc')
    .limit(limit)
    .select({
      id: 'o.id',
      kind: 'o.kind',
      data: 'o.data',
      note: 'o.note',
      severity: 'o.severity',
      status: 'o.status',
      observedAt: 'o.observed_at',
      recordedBy: 'u.name',
    });
}
