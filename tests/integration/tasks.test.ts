import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeMember, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { mailsTo, waitForMail } from '../helpers/mail';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string; name: string };
const as: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 4, vinesPerRow: 12 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

async function flagVines(client: Client, row: number, position: number, toPosition = position, on: { id: string } = block, reason = 'retrain') {
  const id = randomUUID();
  const res = await client.json('/api/sync/flags', 'POST', {
    flags: [{ id, blockId: on.id, row, position, toPosition, reason, note: '', flaggedAt: '2026-11-20T08:00:00Z' }],
  });
  expect((await res.json()).results[0].status).toBe('created');
  return id;
}

/** Waits until this many mails with the subject reached the address; other mail to it does not count. */
async function waitForSubject(address: string, subject: string, count: number, timeoutMs = 15_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await mailsTo(address)).filter((m) => m.subject === subject);
    if (found.length >= count) return found;
    if (Date.now() > deadline) throw new Error(`Expected ${count} mail(s) “${subject}” to ${address}, got ${found.length}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

const inDays = (days: number) => new Date(Date.now() + days * 24 * 3600 * 1000).toISOString().slice(0, 10);

async function makeTask(flagIds: string[], assigneeId = team.pruner.id, over: Record<string, unknown> = {}) {
  const res = await as.manager.json('/api/tasks', 'POST', { flagIds, assigneeId, dueOn: inDays(7), priority: 'high', ...over });
  expect(res.status, await res.clone().text()).toBe(201);
  return (await res.json()).tasks as { id: string; blockId: string; title: string; vines: number; vinesDone: number; status: string; assigneeId: string }[];
}

const done = (taskId: string, row: number, position: number, over: Record<string, unknown> = {}) => ({
  id: randomUUID(),
  taskId,
  blockId: block.id,
  row,
  position,
  note: '',
  doneAt: '2026-11-28T10:00:00Z',
  ...over,
});

async function sendUpdates(client: Client, taskUpdates: unknown[]) {
  const res = await client.json('/api/sync/task-updates', 'POST', { taskUpdates });
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).results as { id: string; status: string; errors?: { field: string; message: string }[] }[];
}

describe('roles table: create and assign tasks', () => {
  it.each([
    ['scout', 403],
    ['pruner', 403],
    ['advisor', 403],
    ['manager', 201],
  ] as const)('answers %s with %i', async (role, status) => {
    const flagId = await flagVines(as.scout, 1, 1);
    const res = await as[role].json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: team.pruner.id, dueOn: inDays(3) });
    expect(res.status).toBe(status);
    expect((await testDb()('flags').where({ id: flagId }).first()).task_id === null).toBe(status !== 201);
  });

  it('lets only a manager reassign or cancel', async () => {
    const [task] = await makeTask([await flagVines(as.scout, 1, 2)]);
    for (const role of ['scout', 'pruner', 'advisor'] as const) {
      expect((await as[role].json(`/api/tasks/${task!.id}`, 'PATCH', { status: 'cancelled' })).status, role).toBe(403);
    }
    expect((await as.manager.json(`/api/tasks/${task!.id}`, 'PATCH', { priority: 'low' })).status).toBe(200);
  });
});

describe('roles table: complete an assigned task', () => {
  it.each([
    ['scout', 403],
    ['advisor', 403],
  ] as const)('answers %s with %i and checks nothing off', async (role, status) => {
    const [task] = await makeTask([await flagVines(as.pruner, 1, 3)]);
    const res = await as[role].json('/api/sync/task-updates', 'POST', { taskUpdates: [done(task!.id, 1, 3)] });
    expect(res.status).toBe(status);
    expect((await testDb()('task_items').where({ task_id: task!.id }).first()).status).toBe('open');
  });

  it('lets the assigned pruner and a manager check vines off', async () => {
    const [task] = await makeTask([await flagVines(as.pruner, 1, 4, 5)]);
    expect((await sendUpdates(as.pruner, [done(task!.id, 1, 4)]))[0]!.status).toBe('created');
    expect((await sendUpdates(as.manager, [done(task!.id, 1, 5)]))[0]!.status).toBe('created');
    expect((await testDb()('tasks').where({ id: task!.id }).first()).status).toBe('done');
  });

  it('refuses a vine of a task assigned to another pruner', async () => {
    const other = await makeMember(team.org.id, 'pruner');
    const [task] = await makeTask([await flagVines(as.pruner, 1, 6)], other.id);
    const [result] = await sendUpdates(as.pruner, [done(task!.id, 1, 6)]);
    expect(result).toMatchObject({ status: 'rejected', errors: [{ field: 'taskId', message: 'This task is assigned to someone else' }] });
  });
});

describe('POST /api/tasks', () => {
  it('turns flags into one task per block, its vines in walking order, and tells the assignee by mail', async () => {
    const second = await makeBlock(team.org.id, { rows: 2, vinesPerRow: 5, name: `Second ${randomUUID().slice(0, 4)}` });
    const flags = [
      await flagVines(as.scout, 2, 3, 5),
      await flagVines(as.pruner, 3, 1, 2),
      await flagVines(as.pruner, 2, 8),
      await flagVines(as.scout, 1, 2, 2, second),
    ];
    const tasks = await makeTask(flags, team.pruner.id, { title: 'Winter care', note: 'Before budbreak' });
    expect(tasks).toHaveLength(2);
    const main = tasks.find((t) => t.blockId === block.id)!;
    expect(main).toMatchObject({ title: 'Winter care', vines: 6, vinesDone: 0, status: 'open', assigneeId: team.pruner.id });

    const detail = await (await as.pruner.fetch(`/api/tasks/${main.id}`)).json();
    // Up row 2, back down row 3.
    expect(detail.items.map((i: { row: number; position: number }) => [i.row, i.position])).toEqual([
      [2, 3],
      [2, 4],
      [2, 5],
      [2, 8],
      [3, 2],
      [3, 1],
    ]);
    expect(detail.items[0].flags).toEqual([expect.objectContaining({ reason: 'retrain' })]);

    const mine = await waitForSubject(team.pruner.email, 'New task for you: Winter care', 2);
    expect(mine).toHaveLength(2);
    expect(mine[0]!.text).toContain(`/field/tasks?task=`);
    expect(mine[0]!.text).toContain('/settings/notifications');
    expect((await testDb()('flags').whereIn('id', flags).pluck('task_id')).every(Boolean)).toBe(true);
  });

  it('refuses a flag already in an open task with 409, and makes nothing', async () => {
    const flagId = await flagVines(as.scout, 4, 1);
    await makeTask([flagId]);
    const fresh = await flagVines(as.scout, 4, 2);
    const res = await as.manager.json('/api/tasks', 'POST', { flagIds: [fresh, flagId], assigneeId: team.pruner.id, dueOn: inDays(2) });
    expect(res.status).toBe(409);
    expect((await testDb()('flags').where({ id: fresh }).first()).task_id).toBeNull();
  });

  it('refuses an assignee who cannot work tasks, or who is not in the organisation, field by field', async () => {
    const flagId = await flagVines(as.scout, 4, 3);
    const advisor = await as.manager.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: team.advisor.id, dueOn: inDays(2) });
    expect(advisor.status).toBe(422);
    expect((await advisor.json()).error.fields.assigneeId[0]).toMatch(/advisor and cannot work tasks/);
    const stranger = await makeTeam();
    const outsider = await as.manager.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: stranger.pruner.id, dueOn: inDays(2) });
    expect(outsider.status).toBe(422);
    expect((await outsider.json()).error.fields.assigneeId).toEqual(['No such person in your organisation']);
  });

  it('names each invalid field', async () => {
    const res = await as.manager.json('/api/tasks', 'POST', { flagIds: [], assigneeId: 'someone', dueOn: 'Friday', priority: 'asap' });
    expect(res.status).toBe(422);
    expect(Object.keys((await res.json()).error.fields).sort()).toEqual(['assigneeId', 'dueOn', 'flagIds', 'priority']);
  });
});

describe('working a task on the phone', () => {
  it('checks vines off once by device id, closes the task and its flags with the last one, and the grid follows', async () => {
    const own = await makeBlock(team.org.id, { rows: 1, vinesPerRow: 6 });
    const finding = {
      id: randomUUID(),
      blockId: own.id,
      row: 1,
      position: 2,
      kind: 'trunk-injury',
      data: { cause: 'cold', severity: 'moderate', girdlingPercent: 10 },
      note: '',
      observedAt: '2026-11-01T09:00:00Z',
    };
    await as.scout.json('/api/sync', 'POST', { observations: [finding] });
    const flagId = await flagVines(as.pruner, 1, 2, 3, own);
    const [task] = await makeTask([flagId]);
    const flaggedBefore = await (await as.manager.fetch(`/api/grid/${own.id}?flagged=1`)).json();
    expect(flaggedBefore.summary.kinds.map((k: { kind: string }) => k.kind)).toEqual(['trunk-injury']);
    const first = done(task!.id, 1, 2, { blockId: own.id, note: 'Laid down two canes' });
    expect(await sendUpdates(as.pruner, [first])).toEqual([{ id: first.id, status: 'created' }]);
    expect(await sendUpdates(as.pruner, [{ ...first, doneAt: '2026-11-28T23:00:00+13:00' }])).toEqual([{ id: first.id, status: 'duplicate' }]);
    expect(await sendUpdates(as.pruner, [{ ...first, note: 'Something else' }])).toEqual([{ id: first.id, status: 'conflict' }]);

    const mine = await (await as.pruner.fetch('/api/tasks?assignee=me&items=1')).json();
    const copy = mine.tasks.find((t: { id: string }) => t.id === task!.id);
    expect(copy.items.map((i: { position: number; status: string; note: string }) => [i.position, i.status, i.note])).toEqual([
      [2, 'done', 'Laid down two canes'],
      [3, 'open', ''],
    ]);
    expect(copy).toMatchObject({ vines: 2, vinesDone: 1, status: 'open' });

    const last = done(task!.id, 1, 3, { blockId: own.id });
    expect(await sendUpdates(as.pruner, [last])).toEqual([{ id: last.id, status: 'created' }]);
    expect(await testDb()('tasks').where({ id: task!.id }).first()).toMatchObject({ status: 'done' });
    expect(await testDb()('flags').where({ id: flagId }).first()).toMatchObject({ status: 'closed', closed_by: team.pruner.id });
    const flaggedAfter = await (await as.manager.fetch(`/api/grid/${own.id}?flagged=1`)).json();
    expect(flaggedAfter.summary.kinds).toEqual([]);
    expect((await (await as.manager.fetch(`/api/flags?block=${own.id}`)).json()).flags).toEqual([]);
  });

  it('rejects vines outside the task, the wrong block and unknown tasks one by one', async () => {
    const [task] = await makeTask([await flagVines(as.pruner, 3, 9)]);
    const answers = await sendUpdates(as.pruner, [
      done(task!.id, 3, 10),
      done(task!.id, 3, 9, { blockId: randomUUID() }),
      done(randomUUID(), 3, 9),
      done(task!.id, 3, 9, { doneAt: 'soon' }),
    ]);
    expect(answers.map((a) => a.errors?.[0]?.field)).toEqual(['position', 'blockId', 'taskId', 'doneAt']);
  });

  it('links the work to a note observation carrying its photos', async () => {
    const [task] = await makeTask([await flagVines(as.pruner, 3, 11)]);
    const observationId = randomUUID();
    await as.pruner.json('/api/sync', 'POST', {
      observations: [
        { id: observationId, blockId: block.id, row: 3, position: 11, kind: 'note', data: {}, note: 'Task done', observedAt: '2026-11-28T10:00:00Z' },
      ],
    });
    await sendUpdates(as.pruner, [done(task!.id, 3, 11, { observationId })]);
    const detail = await (await as.manager.fetch(`/api/tasks/${task!.id}`)).json();
    expect(detail.items[0]).toMatchObject({ status: 'done', observationId, doneByName: team.pruner.name });
  });
});

describe('managing tasks', () => {
  it('reassigns a task and tells the new assignee; cancelling gives the flags back', async () => {
    const newcomer = await makeMember(team.org.id, 'pruner');
    const flagId = await flagVines(as.scout, 4, 6);
    const [task] = await makeTask([flagId]);
    const res = await as.manager.json(`/api/tasks/${task!.id}`, 'PATCH', { assigneeId: newcomer.id, dueOn: inDays(10) });
    expect(res.status).toBe(200);
    expect((await res.json()).task).toMatchObject({ assigneeId: newcomer.id, dueOn: inDays(10) });
    const [mail] = await waitForMail(newcomer.email, 1);
    expect(mail!.subject).toBe(`New task for you: ${task!.title}`);

    const cancelled = await as.manager.json(`/api/tasks/${task!.id}`, 'PATCH', { status: 'cancelled' });
    expect((await cancelled.json()).task.status).toBe('cancelled');
    expect(await testDb()('flags').where({ id: flagId }).first()).toMatchObject({ status: 'open', task_id: null });
    expect((await as.manager.json(`/api/tasks/${task!.id}`, 'PATCH', { priority: 'high' })).status).toBe(409);
    const [late] = await sendUpdates(as.manager, [done(task!.id, 4, 6)]);
    expect(late!.errors).toEqual([{ field: 'taskId', message: 'This task was cancelled; nothing more to do on it' }]);
  });

  it('lists tasks with filters and progress per block', async () => {
    const res = await as.advisor.fetch(`/api/tasks?status=all&block=${block.id}`);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.tasks.length).toBeGreaterThan(3);
    expect(body.tasks.every((t: { blockId: string }) => t.blockId === block.id)).toBe(true);
    const progress = body.progress.find((p: { blockId: string }) => p.blockId === block.id);
    const open = body.tasks.filter((t: { status: string }) => t.status === 'open');
    expect(progress).toMatchObject({ openTasks: open.length, vines: open.reduce((s: number, t: { vines: number }) => s + t.vines, 0) });
    expect((await as.advisor.fetch('/api/tasks?status=sometimes')).status).toBe(422);
  });

  it('sends the assignee one overdue notice for a task past its due date', async () => {
    const late = await makeMember(team.org.id, 'pruner');
    const [task] = await makeTask([await flagVines(as.scout, 4, 12)], late.id, { dueOn: inDays(-2), title: 'Late job' });
    const mails = await waitForMail(late.email, 2, 20_000);
    expect(mails.map((m) => m.subject).sort()).toEqual(['New task for you: Late job', 'Overdue: Late job']);
    await new Promise((r) => setTimeout(r, 3000));
    expect(await mailsTo(late.email)).toHaveLength(2);
    expect(
      await testDb()('mail_outbox')
        .where({ dedupe_key: `overdue:${task!.id}:${inDays(-2)}` })
        .pluck('status'),
    ).toEqual(['sent']);
  });
});

describe('organisation scope', () => {
  it('makes another organisation’s task unreachable: 404 to read or change, rejected to complete, absent from lists', async () => {
    const other = await makeTeam();
    const theirBlock = await makeBlock(other.org.id);
    const theirManager = new Client();
    await theirManager.signIn(other.manager.email, PASSWORD);
    const theirPruner = new Client();
    await theirPruner.signIn(other.pruner.email, PASSWORD);
    const flagId = randomUUID();
    await theirPruner.json('/api/sync/flags', 'POST', {
      flags: [{ id: flagId, blockId: theirBlock.id, row: 1, position: 1, reason: 'replant', note: '', flaggedAt: '2026-11-20T08:00:00Z' }],
    });
    const made = await theirManager.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: other.pruner.id, dueOn: inDays(5) });
    const [theirs] = (await made.json()).tasks;

    expect((await as.manager.fetch(`/api/tasks/${theirs.id}`)).status).toBe(404);
    expect((await as.manager.json(`/api/tasks/${theirs.id}`, 'PATCH', { status: 'cancelled' })).status).toBe(404);
    const [answer] = await sendUpdates(as.manager, [done(theirs.id, 1, 1, { blockId: theirBlock.id })]);
    expect(answer).toMatchObject({ status: 'rejected', errors: [{ field: 'taskId', message: 'No such task in your organisation' }] });
    const all = (await (await as.manager.fetch('/api/tasks?status=all')).json()).tasks as { id: string }[];
    expect(all.map((t) => t.id)).not.toContain(theirs.id);
    expect((await as.manager.json('/api/tasks', 'POST', { flagIds: [flagId], assigneeId: team.pruner.id, dueOn: inDays(5) })).status).toBe(404);
    expect((await as.manager.fetch(`/api/comments?subject=task&id=${theirs.id}`)).status).toBe(404);
    expect(await testDb()('tasks').where({ id: theirs.id }).first()).toMatchObject({ status: 'open', organisation_id: other.org.id });
  });
});
