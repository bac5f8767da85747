import 'server-only';
import type { Desk, DeskFindings, DeskProgressRow } from '@/lib/desk/types';
import { seasonBounds, seasonLabel, seasonOf } from '@/lib/reports/season';
import { can, ROLES } from '@/lib/roles';
import type { Member } from '@/lib/server/auth/guard';
import { db, type Db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import {
  type FreshFindingBlock,
  getLastCommentAt,
  listAdvisorOrganisations,
  listFreshFindings,
  listScoutingCoverage,
  listUntaskedFlagBlocks,
  markDeskSeen,
  recordDeskLook,
} from '@/lib/server/queries/desk';
import { setLocalStatementTimeout } from '@/lib/server/queries/health';
import { listUndeliveredMail } from '@/lib/server/queries/mail-outbox';
import { listMembers } from '@/lib/server/queries/organisations';
import { listSpraysInForce } from '@/lib/server/queries/sprays';
import { listTasks } from '@/lib/server/queries/tasks';
import { type EstateProgress, loadEstateProgress } from '@/lib/server/services/row-work';

/** The Desk's reads answer within this or not at all (a 503), so a slow database never hangs the page. */
const DESK_DEADLINE_MS = 8000;
const UNDELIVERED_SHOWN = 100;

const iso = (d: Date) => d.toISOString();

async function withDeadline<T>(fn: (trx: Db) => Promise<T>): Promise<T> {
  try {
    return await db().transaction(async (trx) => {
      await setLocalStatementTimeout(trx, DESK_DEADLINE_MS);
      return fn(trx);
    });
  } catch (err) {
    if ((err as { code?: string }).code === '57014') {
      throw new AppError('unavailable', 'The Desk took too long to read; try again in a moment.', undefined, { 'retry-after': '10' });
    }
    throw err;
  }
}

const plainBlocks = (blocks: FreshFindingBlock[]) =>
  blocks.map((b) => ({ ...b, vines: b.vines.map((v) => ({ ...v, observedAt: iso(new Date(v.observedAt)) })) }));

async function findingsFor(trx: Db, member: Member, seasonFrom: string): Promise<DeskFindings | null> {
  if (can(member.role, 'manage-tasks')) {
    const look = await recordDeskLook(trx, member.userId, member.organisationId);
    return { since: iso(look.since), basis: look.sinceBasis, blocks: plainBlocks(await listFreshFindings(trx, member.organisationId, look.since)) };
  }
  if (member.role === 'advisor') {
    const last = await getLastCommentAt(trx, member.userId, member.organisationId);
    const since = last ?? new Date(seasonFrom);
    return {
      since: iso(since),
      basis: last ? 'last-comment' : 'season-start',
      blocks: plainBlocks(await listFreshFindings(trx, member.organisationId, since)),
    };
  }
  return null;
}

/**
 * Everything the Desk shows, for the person's role in their current organisation, in one
 * transaction (one snapshot, one deadline), with a manager's winter-work progress read beside it.
 * A manager's visit counts as a look at the Desk.
 */
export async function loadDesk(member: Member, now = new Date()): Promise<Desk> {
  const season = seasonOf(now, member.seasonStartMonth);
  const [desk, progress] = await Promise.all([
    readDesk(member, season, now),
    can(member.role, 'manage-tasks') ? loadEstateProgress(member.organisationId, season) : null,
  ]);
  return { ...desk, progress: progress && passesUnderWay(progress) };
}

/** Passes begun and not yet finished, block by block, for the Desk's winter-work list. */
function passesUnderWay(progress: EstateProgress): DeskProgressRow[] {
  return progress.blocks.flatMap(({ block, passes }) =>
    passes
      .filter((p) => p.vinesDone > 0 && p.vinesDone < p.vineCount)
      .map((p) => ({
        blockId: block.id,
        blockName: block.name,
        pass: p.pass,
        vinesDone: p.vinesDone,
        vineCount: p.vineCount,
        projectedFinish: p.projectedFinish,
      })),
  );
}

async function readDesk(member: Member, season: number, now: Date): Promise<Desk> {
  const org = member.organisationId;
  const period = seasonBounds(season, member.seasonStartMonth);
  const manages = can(member.role, 'manage-tasks');
  return withDeadline(async (trx) => {
    const findings = await findingsFor(trx, member, period.from);
    const untaskedFlags = manages ? await listUntaskedFlagBlocks(trx, org) : null;
    const overdue = manages ? await listTasks(trx, org, { status: 'open', overdue: true }, 200) : null;
    const mine = !manages && can(member.role, 'complete-task') ? await listTasks(trx, org, { status: 'open', assigneeId: member.userId }, 1000) : null;
    const sprays = await listSpraysInForce(trx, org);
    const coverage = await listScoutingCoverage(trx, org, period);
    const undelivered = can(member.role, 'manage-organisation') ? await listUndeliveredMail(trx, org, UNDELIVERED_SHOWN + 1) : null;
    const advisorOf = member.memberships.filter((m) => m.role === 'advisor');
    const advisorOrganisations =
      member.role === 'advisor'
        ? await listAdvisorOrganisations(
            trx,
            member.userId,
            advisorOf.map((m) => ({ organisationId: m.organisationId, seasonFrom: seasonBounds(seasonOf(now, m.seasonStartMonth), m.seasonStartMonth).from })),
          )
        : null;
    const members = await listMembers(trx, org);
    return {
      role: member.role,
      organisationName: member.organisationName,
      season,
      seasonLabel: seasonLabel(season, member.seasonStartMonth),
      untaskedFlags: untaskedFlags?.map((b) => ({ ...b, oldestAt: iso(b.oldestAt) })) ?? null,
      overdueTasks:
        overdue?.map((t) => ({
          id: t.id,
          title: t.title,
          blockId: t.blockId,
          blockName: t.blockName,
          assigneeName: t.assigneeName,
          dueOn: t.dueOn!,
          priority: t.priority,
          vines: t.vines,
          vinesDone: t.vinesDone,
        })) ?? null,
      myTasks: mine ? { open: mine.length, overdue: mine.filter((t) => t.overdue).length } : null,
      reentry: sprays.map((s) => ({
        id: s.id,
        blockId: s.blockId,
        blockName: s.blockName,
        product: s.product,
        appliedAt: iso(new Date(s.appliedAt)),
        reiHours: s.reiHours,
        reentryAt: iso(new Date(s.reentryAt)),
      })),
      findings,
      coverage,
      undeliveredMail: undelivered ? { count: Math.min(undelivered.length, UNDELIVERED_SHOWN), more: undelivered.length > UNDELIVERED_SHOWN } : null,
      advisorOrganisations:
        advisorOrganisations?.map((o) => ({
          ...o,
          current: o.organisationId === org,
          lastCommentAt: o.lastCommentAt ? iso(o.lastCommentAt) : null,
          since: iso(o.since),
        })) ?? null,
      team: ROLES.map((role) => ({ role, count: members.filter((m) => m.role === role).length })),
      progress: null,
    };
  });
}

/** The manager's "mark as seen": the Desk's new findings start from now. */
export async function markDeskLooked(member: Member) {
  if (!can(member.role, 'manage-tasks')) throw new AppError('forbidden', 'Only managers keep a record of their looks at the Desk.');
  const look = await markDeskSeen(db(), member.userId, member.organisationId);
  return { since: iso(look.since) };
}
