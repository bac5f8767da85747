import 'server-only';
import { planFromObservations } from '@/lib/grid/vine-plan';
import type { CheckedVine, PrunerDeviation, PruningCheckReport, TaskDetail, TaskList, TaskView } from '@/lib/contracts/tasks';
import type { Sendable } from '@/lib/contracts/http';
import { can } from '@/lib/roles';
import type { Member } from '@/lib/server/auth/guard';
import { db, type Db } from '@/lib/server/db';
import { AppError } from '@/lib/server/errors';
import { attachFlagsToTask, closeTaskFlags, existingFlagIds, lockOpenFlags, releaseTaskFlags } from '@/lib/server/queries/flags';
import {
  blockProgress,
  completeFinishedTasks,
  getMembership,
  getStoredTaskUpdateHashes,
  getTask,
  insertTask,
  insertTaskItems,
  ingestTaskUpdates,
  listPlanMeasurements,
  listPruningChecks,
  listTaskItems,
  listTasks,
  lockTask,
  slotsInRuns,
  updateTaskRow,
} from '@/lib/server/queries/tasks';
import { wakeMailWorker } from '@/lib/server/services/mail-worker';
import { queueAssignmentMail } from '@/lib/server/services/notifications';
import { hashPayload, racedIds, rejected, settleOnce, validateRecords, type StoredHash, type SyncResult, type ValidRecord } from '@/lib/server/services/sync';
import { REASON_LABELS, type FlagReason } from '@/lib/validation/flag';
import { taskUpdateRecordSchema, type CreateTasksInput, type TaskListQuery, type TaskUpdateRecord, type UpdateTaskInput } from '@/lib/validation/task';
import { settingsForBlocks } from '@/lib/server/services/settings';
import { budDeviationPercent, pruningCheckBuds } from '@/lib/viticulture';

/** The person who will do the work: a member of this organisation whose role completes tasks. */
async function requireAssignee(trx: Db, member: Member, assigneeId: string) {
  const assignee = await getMembership(trx, member.organisationId, assigneeId);
  if (!assignee) throw new AppError('invalid-input', 'Some fields are not valid.', { assigneeId: ['No such person in your organisation'] });
  if (!can(assignee.role, 'complete-task')) {
    throw new AppError('invalid-input', 'Some fields are not valid.', {
      assigneeId: [
        `${assignee.name ?? assignee.email} is ${assignee.role === 'advisor' ? 'an' : 'a'} ${assignee.role} and cannot work tasks; choose a pruner or a manager`,
      ],
    });
  }
  return assignee;
}

/** Rows in walking order: up the first row, back down the next, as a crew walks a block. */
function walkingOrder<T extends { row_number: number; position: number }>(slots: T[]) {
  const rows = [...new Set(slots.map((s) => s.row_number))].sort((a, b) => a - b);
  return rows.flatMap((row, i) => slots.filter((s) => s.row_number === row).sort((a, b) => (i % 2 === 0 ? a.position - b.position : b.position - a.position)));
}

function titleFor(reasons: FlagReason[], rows: number[]) {
  const kinds = [...new Set(reasons)].map((r) => (r === 'other' ? 'Extra care' : REASON_LABELS[r]));
  const first = Math.min(...rows);
  const last = Math.max(...rows);
  return `${kinds.slice(0, 2).join(' and ')}${kinds.length > 2 ? ' and more' : ''}, row${first === last ? ` ${first}` : `s ${first}–${last}`}`;
}

/**
 * Turns open flags into tasks, one per block: the flags' vines become the task's items in walking
 * order. Flags already worked by an open task, closed flags and other organisations' ids are refused
 * as a whole, so nothing is half made.
 */
/** Tasks with their progress, and progress per block; `assignee=me&items=1` is the phone's copy for working offline. */
export async function listTaskViews(member: Member, q: TaskListQuery): Promise<Sendable<TaskList>> {
  const tasks = await listTasks(db(), member.organisationId, {
    status: q.status,
    assigneeId: q.assignee === 'me' ? member.userId : q.assignee,
    block: q.block,
    priority: q.priority,
  });
  const [items, progress] = await Promise.all([
    q.items
      ? listTaskItems(
          db(),
          tasks.map((t) => t.id),
        )
      : undefined,
    blockProgress(db(), member.organisationId),
  ]);
  return {
    tasks: items ? tasks.map((t) => ({ ...t, items: items.filter((i) => i.taskId === t.id) })) : tasks,
    progress,
    fetchedAt: new Date().toISOString(),
  };
}

export async function createTasks(member: Member, input: CreateTasksInput): Promise<TaskView<Date>[]> {
  const ids = [...new Set(input.flagIds)];
  const created = await db().transaction(async (trx) => {
    const assignee = await requireAssignee(trx, member, input.assigneeId);
    const flags = await lockOpenFlags(trx, member.organisationId, ids);
    if (flags.length !== ids.length) {
      const found = new Set(flags.map((f) => f.id));
      const missing = ids.filter((id) => !found.has(id));
      const closed = await existingFlagIds(trx, member.organisationId, missing);
      if (closed.length)
        throw new AppError('conflict', `${closed.length === 1 ? 'A flag was' : `${closed.length} flags were`} closed meanwhile; reload the list.`);
      throw new AppError('not-found', 'No such flag in your organisation.');
    }
    const busy = flags.filter((f) => f.task_id);
    if (busy.length) {
      throw new AppError('conflict', `${busy.length === 1 ? 'A flag is' : `${busy.length} flags are`} already in an open task; reload the list.`);
    }
    const byBlock = new Map<string, typeof flags>();
    for (const f of flags) byBlock.set(f.block_id, [...(byBlock.get(f.block_id) ?? []), f]);

    const made: { id: string; assignedAt: Date; title: string; blockId: string; vines: number }[] = [];
    for (const [blockId, blockFlags] of byBlock) {
      const slots = walkingOrder(
        await slotsInRuns(
          trx,
          blockId,
          blockFlags.map((f) => ({ row: f.row_number, from: f.position, to: f.to_position })),
        ),
      );
      if (slots.length === 0) throw new AppError('conflict', 'The flagged vines are no longer in the block layout; close those flags instead.');
      const title =
        input.title ||
        titleFor(
          blockFlags.map((f) => f.reason),
          blockFlags.map((f) => f.row_number),
        );
      const task = await insertTask(trx, {
        organisation_id: member.organisationId,
        block_id: blockId,
        title,
        note: input.note,
        assignee_id: assignee.userId,
        due_on: input.dueOn,
        priority: input.priority,
        created_by: member.userId,
      });
      await insertTaskItems(
        trx,
        slots.map((s, i) => ({ task_id: task.id, position_id: s.id, row_number: s.row_number, position: s.position, sequence: i + 1 })),
      );
      await attachFlagsToTask(
        trx,
        blockFlags.map((f) => f.id),
        task.id,
      );
      made.push({ id: task.id, assignedAt: task.assigned_at, title, blockId, vines: slots.length });
    }
    for (const t of made) {
      const view = (await getTask(trx, member.organisationId, t.id))!;
      await queueAssignmentMail(trx, {
        organisationId: member.organisationId,
        task: { id: t.id, title: t.title, blockName: view.blockName, dueOn: input.dueOn, priority: input.priority, vines: t.vines, note: input.note },
        assigneeId: assignee.userId,
        assignedAt: t.assignedAt,
        by: member,
      });
    }
    return made.map((t) => t.id);
  });
  wakeMailWorker({ schedule: true });
  return Promise.all(created.map(async (id) => (await getTask(db(), member.organisationId, id))!));
}

export async function getTaskDetail(member: Member, id: string): Promise<TaskDetail<Date>> {
  const task = await getTask(db(), member.organisationId, id);
  if (!task) throw new AppError('not-found', 'No such task in your organisation.');
  return { task, items: await listTaskItems(db(), [id]) };
}

/** Reassign, move the due date, change priority, or cancel (which gives the flags back). */
export async function updateTask(member: Member, id: string, input: UpdateTaskInput) {
  await db().transaction(async (trx) => {
    const task = await lockTask(trx, member.organisationId, id);
    if (!task) throw new AppError('not-found', 'No such task in your organisation.');
    if (task.status !== 'open') throw new AppError('conflict', `This task is ${task.status === 'done' ? 'done' : 'cancelled'} and can no longer change.`);
    const reassigned = input.assigneeId !== undefined && input.assigneeId !== task.assignee_id;
    if (reassigned) await requireAssignee(trx, member, input.assigneeId!);
    const row = await updateTaskRow(trx, id, {
      ...(reassigned ? { assignee_id: input.assigneeId } : {}),
      ...(input.dueOn ? { due_on: input.dueOn } : {}),
      ...(input.priority ? { priority: input.priority } : {}),
      ...(input.status ? { status: input.status } : {}),
    });
    if (input.status === 'cancelled') await releaseTaskFlags(trx, id);
    if (reassigned && input.status !== 'cancelled') {
      const view = (await getTask(trx, member.organisationId, id))!;
      await queueAssignmentMail(trx, {
        organisationId: member.organisationId,
        task: { id, title: view.title, blockName: view.blockName, dueOn: view.dueOn ?? '', priority: view.priority, vines: view.vines, note: view.note },
        assigneeId: input.assigneeId!,
        assignedAt: row.assigned_at,
        by: member,
      });
    }
  });
  wakeMailWorker({ schedule: true });
  return getTaskDetail(member, id);
}

const updateHash = (r: TaskUpdateRecord) =>
  hashPayload({
    taskId: r.taskId,
    blockId: r.blockId,
    row: r.row,
    position: r.position,
    note: r.note,
    observationId: r.observationId ?? null,
    doneAt: new Date(r.doneAt).toISOString(),
  });

/**
 * The phone's "this vine is done" records, once-only like every field record. The assignee (or a
 * manager) checks off vines of an open task; the last vine done closes the task and its flags.
 */
export async function syncTaskUpdates(member: Member, records: unknown[]): Promise<SyncResult[]> {
  const results: SyncResult[] = new Array(records.length);
  const valid = validateRecords(records, taskUpdateRecordSchema, updateHash, results);
  const candidates = valid.map(({ record: r, hash }) => ({
    id: r.id,
    task_id: r.taskId,
    block_id: r.blockId,
    row_number: r.row,
    position: r.position,
    note: r.note,
    observation_id: r.observationId ?? null,
    done_at: r.doneAt,
    payload_sha256: hash,
  }));
  const outcomes = await db().transaction(async (trx) => {
    const found = await ingestTaskUpdates(trx, member.organisationId, { userId: member.userId, mayDoAnyTask: member.role === 'manager' }, candidates);
    const touched = found.filter((o) => o.inserted).map((o) => o.taskId);
    const finished = await completeFinishedTasks(trx, touched);
    await closeTaskFlags(trx, finished, member.userId);
    return found;
  });

  const pending: ValidRecord<TaskUpdateRecord>[] = [];
  const created = new Set<string>();
  const stored: StoredHash[] = [];
  for (const [i, v] of valid.entries()) {
    const r = v.record;
    const o = outcomes[i]!;
    const refuse = (field: string, message: string) => (results[v.index] = rejected(r.id, [{ field, message }]));
    if (o.storedOrg) {
      stored.push({ id: r.id, organisation_id: o.storedOrg, payload_sha256: o.storedHash! });
      pending.push(v);
    } else if (!o.taskFound) refuse('taskId', 'No such task in your organisation');
    else if (o.taskBlockId !== r.blockId) refuse('blockId', 'This task is in another block');
    else if (!o.itemFound) refuse('position', `Row ${r.row}, vine ${r.position} is not part of this task`);
    else if (o.taskStatus === 'cancelled') refuse('taskId', 'This task was cancelled; nothing more to do on it');
    else if (o.assigneeId !== member.userId && member.role !== 'manager') refuse('taskId', 'This task is assigned to someone else');
    else {
      if (o.inserted) created.add(r.id);
      pending.push(v);
    }
  }
  stored.push(...(await getStoredTaskUpdateHashes(db(), racedIds(pending, created, stored))));
  settleOnce(pending, created, stored, member.organisationId, results);
  return results;
}

const mean = (xs: number[]) => (xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null);
const round1 = (x: number | null) => (x === null ? null : Math.round(x * 10) / 10);

/**
 * Each pruner's deviation over the sample of checked vines: buds and renewal spurs left against the
 * block's target (as the crew was told it) and against each vine's plan, so the crew lead sees early
 * who leaves too many or too few.
 */
export async function pruningCheckReport(member: Member, f: { block?: string; from?: string; to?: string }): Promise<PruningCheckReport> {
  const checks = await listPruningChecks(db(), member.organisationId, f);
  const [measurements, settingsOf] = await Promise.all([
    listPlanMeasurements(
      db(),
      member.organisationId,
      checks.map((c) => c.positionId),
    ),
    settingsForBlocks(db(), member.organisationId, [...new Set(checks.map((c) => c.blockId))]),
  ]);
  // Each check is judged by its own block's band; the one shown is the block's asked for, else the organisation's.
  const fineOf = new Map<string, number>();
  const vines: CheckedVine[] = checks.map((c) => {
    const settings = settingsOf(c.blockId);
    fineOf.set(c.id, settings.pruningRecord.fineWithinPercent);
    const budsLeft = pruningCheckBuds(c.data, settings);
    const target = c.data.budTarget ?? null;
    const readings = measurements
      .filter((m) => m.positionId === c.positionId && m.observedAt <= c.observedAt)
      .map((m) => ({ kind: m.kind, data: m.data, observedAt: m.observedAt.toISOString() }));
    const { plan } = planFromObservations(c.trainingSystem, readings, undefined, settings);
    return {
      id: c.id,
      blockId: c.blockId,
      blockName: c.blockName,
      row: c.row,
      position: c.position,
      observedAt: c.observedAt.toISOString(),
      checkedByName: c.checkedByName,
      prunerId: c.data.prunedBy,
      budsLeft,
      renewalSpurs: c.data.renewalSpurs,
      budTarget: target,
      targetDeviationPercent: target ? round1(budDeviationPercent(budsLeft, target)) : null,
      planBuds: plan ? plan.totalBuds : null,
      planRenewalSpurs: plan ? plan.renewalSpurs : null,
      planDeviationBuds: plan ? budsLeft - plan.totalBuds : null,
    };
  });
  const names = new Map(checks.map((c) => [c.data.prunedBy, c.prunerName]));
  const pruners: PrunerDeviation[] = [...new Set(vines.map((v) => v.prunerId))].map((prunerId) => {
    const mine = vines.filter((v) => v.prunerId === prunerId);
    const targeted = mine.filter((v) => v.targetDeviationPercent !== null);
    const planned = mine.filter((v) => v.planBuds !== null);
    return {
      prunerId,
      prunerName: names.get(prunerId) ?? null,
      vines: mine.length,
      budsLeftMean: round1(mean(mine.map((v) => v.budsLeft)))!,
      targetDeviationMeanPercent: round1(mean(targeted.map((v) => v.targetDeviationPercent!))),
      offTargetShare: targeted.length ? round1(targeted.filter((v) => Math.abs(v.targetDeviationPercent!) > fineOf.get(v.id)!).length / targeted.length) : null,
      renewalSpursMean: round1(mean(mine.map((v) => v.renewalSpurs)))!,
      planChecks: planned.length,
      planDeviationMeanBuds: round1(mean(planned.map((v) => v.planDeviationBuds!))),
      planSpurDeviationMean: round1(mean(planned.map((v) => v.renewalSpurs - v.planRenewalSpurs!))),
    };
  });
  pruners.sort(
    (a, b) =>
      Math.abs(b.targetDeviationMeanPercent ?? 0) - Math.abs(a.targetDeviationMeanPercent ?? 0) || (a.prunerName ?? '').localeCompare(b.prunerName ?? ''),
  );
  return { finePercent: settingsOf(f.block ?? '').pruningRecord.fineWithinPercent, pruners, checks: vines };
}
