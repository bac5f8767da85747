import 'server-only';
import type { BlockReport } from '@/lib/reports/block-report';
import type { Db } from '@/lib/server/db';

export interface SnapshotLookup {
  blockId: string;
  season: number;
  key: string;
}

export interface SnapshotFound {
  /** The block's revision now (0 before its first change): a report worked out from here is stamped with it. */
  revision: number;
  /** The report kept under the key at that revision, if any. */
  report: BlockReport | null;
}

/**
 * Each block's revision and the snapshot kept for it at that revision, in one statement. The
 * revision is read first on purpose: a report worked out after it sees at least what it counts.
 */
export async function findSnapshots(db: Db, lookups: SnapshotLookup[]): Promise<SnapshotFound[]> {
  if (lookups.length === 0) return [];
  const { rows } = await db.raw<{ rows: { i: number; revision: string; report: BlockReport | null }[] }>(
    `select l.i, coalesce(r.revision, 0) as revision, s.report
       from unnest(?::uuid[], ?::int[], ?::text[]) with ordinality l(block_id, season, key, i)
       left join block_revisions r on r.block_id = l.block_id
       left join report_snapshots s on s.block_id = l.block_id and s.season = l.season and s.key = l.key
        and s.revision = coalesce(r.revision, 0)
      order by l.i`,
    [lookups.map((l) => l.blockId), lookups.map((l) => l.season), lookups.map((l) => l.key)],
  );
  return rows.map((r) => ({ revision: Number(r.revision), report: r.report }));
}

/**
 * Keeps a report worked out at `revision`, unless one from a later revision is there already, and
 * drops the block's other snapshots that can no longer be used (an earlier revision) or were made
 * over a month ago (inputs a person tried once). The one being written is left to the upsert: a
 * statement may not change a row twice.
 */
export async function saveSnapshot(db: Db, at: SnapshotLookup & { revision: number; report: BlockReport }) {
  await db.raw(
    `with kept as (
       insert into report_snapshots as s (block_id, season, key, revision, report)
       values (?, ?, ?, ?, ?::jsonb)
       on conflict (block_id, season, key) do update set revision = excluded.revision, report = excluded.report, made_at = now()
         where s.revision <= excluded.revision
     )
     delete from report_snapshots
      where block_id = ? and (season, key) <> (?::int, ?::text) and (revision < ? or made_at < now() - interval '30 days')`,
    [at.blockId, at.season, at.key, at.revision, JSON.stringify(at.report), at.blockId, at.season, at.key, at.revision],
  );
}
