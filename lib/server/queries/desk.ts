import 'server-only';
import type { Db } from '@/lib/server/db';
import type { FlagReason } from '@/lib/validation/flag';
import type { DeskFindingBlock, DeskFreshVine } from '@/lib/desk/types';

/**
 * The Desk's reads: what needs doing in one organisation this morning. Every function takes the
 * organisation (or the person's own memberships) and reads nothing else.
 */

/** After this long without a look, the next look starts a new sitting (common practice, no source). */
export const DESK_SITTING_MINUTES = 60;
/** A first look shows the findings of this many days before it (common practice, no source). */
export const DESK_FIRST_LOOK_DAYS = 7;

export interface DeskLook {
  /** What the Desk shows as new was received after this. */
  since: Date;
  sinceBasis: 'first-look' | 'last-look' | 'marked-seen';
  lookedAt: Date;
}

/**
 * Records a look at the Desk and answers the window it shows. Within a sitting the window stays
 * put; once a sitting is over, it starts at the look before. One statement, so two tabs opening
 * the Desk at once cannot both move it.
 */
export async function recordDeskLook(db: Db, userId: string, organisationId: string): Promise<DeskLook> {
  const { rows } = await db.raw<{ rows: DeskLook[] }>(
    `insert into desk_looks as l (user_id, organisation_id, looked_at, since, since_basis)
     values (?, ?, now(), now() - ? * interval '1 day', 'first-look')
     on conflict (user_id, organisation_id) do update set
       since = case when l.looked_at < now() - ? * interval '1 minute' then l.looked_at else l.since end,
       since_basis = case when l.looked_at < now() - ? * interval '1 minute' then 'last-look' else l.since_basis end,
       looked_at = now()
     returning since, since_basis as "sinceBasis", looked_at as "lookedAt"`,
    [userId, organisationId, DESK_FIRST_LOOK_DAYS, DESK_SITTING_MINUTES, DESK_SITTING_MINUTES],
  );
  return rows[0]!;
}

/** "Mark as seen": nothing received until now counts as new any more. */
export async function markDeskSeen(db: Db, userId: string, organisationId: string): Promise<DeskLook> {
  const { rows } = await db.raw<{ rows: DeskLook[] }>(
    `insert into desk_looks as l (user_id, organisation_id, looked_at, since, since_basis) values (?, ?, now(), now(), 'marked-seen')
     on conflict (user_id, organisation_id) do update set since = now(), since_basis = 'marked-seen', looked_at = now()
     returning since, since_basis as "sinceBasis", looked_at as "lookedAt"`,
    [userId, organisationId],
  );
  return rows[0]!;
}

export interface UntaskedFlagBlock {
  blockId: string;
  blockName: string;
  flags: number;
  /** Vines the flags cover, runs counted vine by vine. */
  vines: number;
  byReason: { reason: FlagReason; flags: number }[];
  oldestAt: Date;
}

/**
 * Open flags that no open task works yet, per block, oldest waiting first. A flag whose task was
 * cancelled is free again, as on the flags list ("not in a task").
 */
export async function listUntaskedFlagBlocks(db: Db, organisationId: string): Promise<UntaskedFlagBlock[]> {
  const { rows } = await db.raw<{ rows: UntaskedFlagBlock[] }>(
    `with free as (
       select f.block_id, f.reason, f.to_position - f.position + 1 as vines, f.flagged_at
         from flags f
         left join tasks t on t.id = f.task_id
        where f.organisation_id = ? and f.status = 'open' and (f.task_id is null or t.status <> 'open')
     )
     select b.id as "blockId", b.name as "blockName", count(*)::int as flags, sum(free.vines)::int as vines,
            (select json_agg(json_build_object('reason', reason, 'flags', n) order by n desc, reason)
               from (select reason, count(*)::int as n from free r where r.block_id = b.id group by reason) x) as "byReason",
            min(free.flagged_at) as "oldestAt"
       from free join blocks b on b.id = free.block_id and b.archived_at is null
      group by b.id, b.name
      order by min(free.flagged_at), b.name`,
    [organisationId],
  );
  return rows;
}

// The Desk's JSON shapes are the rows these queries read (observedAt already an ISO string).
export type FreshVine = DeskFreshVine;
export type FreshFindingBlock = DeskFindingBlock;

/**
 * Open findings ("watch" or worse, not deleted) that reached the server after `since`, per block:
 * blocks with vines to act on now first. Received, not observed: a record synced late is still
 * news to the person who looked before it arrived.
 */
export async function listFreshFindings(db: Db, organisationId: string, since: Date, perBlock = 6): Promise<FreshFindingBlock[]> {
  const { rows } = await db.raw<{ rows: FreshFindingBlock[] }>(
    `with fresh as materialized (
       select o.block_id, o.row_number, o.position, o.kind, o.severity, o.observed_at
         from observations o
        where o.organisation_id = ? and o.deleted_at is null and o.severity >= 1 and o.status = 'open' and o.received_at > ?
     ), vines as (
       select distinct on (block_id, row_number, position) block_id, row_number, position, kind, severity, observed_at
         from fresh order by block_id, row_number, position, severity desc, observed_at desc
     ), ranked as (
       select v.*, row_number() over (partition by block_id order by severity desc, observed_at desc, row_number, position) as rank from vines v
     )
     select b.id as "blockId", b.name as "blockName", b.vines_per_panel as "vinesPerPanel",
            count(*) filter (where r.severity = 3)::int as "actNow",
            count(*) filter (where r.severity = 2)::int as "actThisSeason",
            count(*) filter (where r.severity = 1)::int as watch,
            (select count(*)::int from fresh f where f.block_id = b.id) as findings,
            json_agg(json_build_object('row', r.row_number, 'position', r.position, 'kind', r.kind, 'severity', r.severity, 'observedAt', r.observed_at)
                     order by r.rank) filter (where r.rank <= ?) as vines
       from ranked r join blocks b on b.id = r.block_id and b.archived_at is null
      group by b.id, b.name, b.vines_per_panel
      order by max(r.severity) desc, count(*) filter (where r.severity = 3) desc, count(*) filter (where r.severity = 2) desc, b.name`,
    [organisationId, since, perBlock],
  );
  return rows;
}

export interface BlockCoverage {
  blockId: string;
  blockName: string;
  /** Planted and replant slots: the vines there are to scout. */
  standing: number;
  /** Distinct vines with a live record in the season, missing-vine records aside. */
  scouted: number;
}

/**
 * Scouting coverage per active block in a season, counted as the season report counts it
 * (lib/reports/block-report.ts, "Vines scouted"): distinct vines of the block's rows with any live
 * record in the season but a missing-vine one, over the standing vines.
 */
export async function listScoutingCoverage(db: Db, organisationId: string, period: { from: string; to: string }): Promise<BlockCoverage[]> {
  // One grouped pass over the season's records for all blocks (a subquery per block would run
  // serially: PostgreSQL does not parallelise correlated subplans; see tests/bench/desk.bench.ts).
  const { rows } = await db.raw<{ rows: BlockCoverage[] }>(
    `with vines as (
       select o.block_id, o.row_number, o.position from observations o
        where o.organisation_id = ? and o.deleted_at is null and o.observed_at >= ? and o.observed_at < ? and o.kind <> 'missing-vine'
        group by o.block_id, o.row_number, o.position
     ), scouted as (
       select v.block_id, count(*)::int as n from vines v
        where exists (select 1 from block_rows br where br.block_id = v.block_id and br.row_number = v.row_number)
        group by v.block_id
     ), standing as (
       select vp.block_id, count(*)::int as n from vine_positions vp
         join blocks b on b.id = vp.block_id and b.organisation_id = ? and b.archived_at is null
        where vp.status in ('planted', 'replant')
        group by vp.block_id
     )
     select b.id as "blockId", b.name as "blockName", coalesce(st.n, 0) as standing, coalesce(sc.n, 0) as scouted
       from blocks b
       left join standing st on st.block_id = b.id
       left join scouted sc on sc.block_id = b.id
      where b.organisation_id = ? and b.archived_at is null
      order by b.name`,
    [organisationId, period.from, period.to, organisationId, organisationId],
  );
  return rows;
}

export interface AdvisorOrganisation {
  organisationId: string;
  organisationName: string;
  lastCommentAt: Date | null;
  /** The window: since the last comment, or since the season began without one. */
  since: Date;
  findings: number;
  actNow: number;
  blocks: number;
}

/**
 * For each organisation given (the person's own advisor memberships, resolved by the guard), the
 * open findings received since the person's last comment there, or since the season began there
 * when they have not commented yet.
 */
export async function listAdvisorOrganisations(
  db: Db,
  userId: string,
  organisations: { organisationId: string; seasonFrom: string }[],
): Promise<AdvisorOrganisation[]> {
  if (organisations.length === 0) return [];
  const { rows } = await db.raw<{ rows: AdvisorOrganisation[] }>(
    `with mine as (
       select m.organisation_id, org.name, x.season_from,
              (select max(c.created_at) from comments c where c.author_id = m.user_id and c.organisation_id = m.organisation_id) as last_comment_at
         from unnest(?::uuid[], ?::timestamptz[]) as x(organisation_id, season_from)
         join memberships m on m.organisation_id = x.organisation_id and m.user_id = ?
         join organisations org on org.id = m.organisation_id
     )
     select mine.organisation_id as "organisationId", mine.name as "organisationName", mine.last_comment_at as "lastCommentAt",
            coalesce(mine.last_comment_at, mine.season_from) as since,
            coalesce(f.findings, 0) as findings, coalesce(f.act_now, 0) as "actNow", coalesce(f.blocks, 0) as blocks
       from mine
       left join lateral (
         select count(*)::int as findings, count(*) filter (where o.severity = 3)::int as act_now, count(distinct o.block_id)::int as blocks
           from observations o join blocks b on b.id = o.block_id and b.archived_at is null
          where o.organisation_id = mine.organisation_id and o.deleted_at is null and o.severity >= 1 and o.status = 'open'
            and o.received_at > coalesce(mine.last_comment_at, mine.season_from)
       ) f on true
      order by coalesce(f.act_now, 0) desc, coalesce(f.findings, 0) desc, mine.name`,
    [organisations.map((o) => o.organisationId), organisations.map((o) => o.seasonFrom), userId],
  );
  return rows;
}

/** When the person last commented in the organisation, if ever. */
export async function getLastCommentAt(db: Db, userId: string, organisationId: string): Promise<Date | null> {
  const row = await db('comments').where({ author_id: userId, organisation_id: organisationId }).max<{ at: Date | null }>('created_at as at').first();
  return row?.at ?? null;
}
