import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';

afterAll(closeTestDb);

/**
 * The Desk's items, each against records made by hand here: flags, tasks, sprays, observations
 * with known received times and severities, comments, mail. Expected figures are counted from
 * these fixtures, never from the code's own settings.
 */
type Team = Awaited<ReturnType<typeof makeTeam>>;
type Block = { id: string; name: string };
let team: Team;
let other: Team;
let manager: Client;
let otherManager: Client;
let a1: Block;
let a2: Block;
let b1: Block;

const HOUR = 3600_000;
const ago = (hours: number) => new Date(Date.now() - hours * HOUR).toISOString();
const dayOffset = (days: number) => new Date(Date.now() + days * 24 * HOUR).toISOString().slice(0, 10);
const thisYear = new Date().getUTCFullYear();

async function as(email: string) {
  const client = new Client();
  await client.signIn(email, PASSWORD);
  return client;
}

async function desk(client: Client) {
  const res = await client.fetch('/api/desk');
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).desk;
}

async function slot(block: Block, row: number, position: number) {
  return (await testDb()('vine_positions').where({ block_id: block.id, row_number: row, position }).first('id')).id as string;
}

/** An observation as the server would hold it, with the severity and received time chosen here. */
async function observe(
  org: { id: string },
  block: Block,
  row: number,
  position: number,
  o: { severity: number; receivedAt?: string; observedAt?: string; kind?: string; status?: 'open' | 'closed'; deleted?: boolean },
) {
  const id = randomUUID();
  await testDb()('observations').insert({
    id,
    organisation_id: org.id,
    block_id: block.id,
    position_id: await slot(block, row, position),
    row_number: row,
    position,
    kind: o.kind ?? 'trunk-injury',
    data: {},
    observed_at: o.observedAt ?? o.receivedAt ?? ago(1),
    received_at: o.receivedAt ?? ago(1),
    severity: o.severity,
    status: o.status ?? 'open',
    deleted_at: o.deleted ? new Date().toISOString() : null,
    payload_sha256: 'test',
  });
  return id;
}

async function flag(
  org: { id: string },
  block: Block,
  row: number,
  from: number,
  to: number,
  o: { reason?: string; taskId?: string; status?: 'open' | 'closed' } = {},
) {
  const id = randomUUID();
  await testDb()('flags').insert({
    id,
    organisation_id: org.id,
    block_id: block.id,
    position_id: await slot(block, row, from),
    row_number: row,
    position: from,
    to_position: to,
    reason: o.reason ?? 'retrain',
    flagged_at: ago(48),
    status: o.status ?? 'open',
    task_id: o.taskId ?? null,
    payload_sha256: 'test',
  });
  return id;
}

async function task(org: { id: string }, block: Block, o: { status?: 'open' | 'done' | 'cancelled'; dueOn?: string | null; title?: string } = {}) {
  const [row] = await testDb()('tasks')
    .insert({
      organisation_id: org.id,
      block_id: block.id,
      title: o.title ?? 'Retrain',
      status: o.status ?? 'open',
      due_on: o.dueOn === undefined ? dayOffset(7) : o.dueOn,
    })
    .returning('id');
  return row.id as string;
}

async function spray(org: { id: string }, block: Block, appliedHoursAgo: number, reiHours: number) {
  const [row] = await testDb()('sprays')
    .insert({ organisation_id: org.id, block_id: block.id, product: 'Test sulfur', applied_at: ago(appliedHoursAgo), rei_hours: reiHours })
    .returning('id');
  return row.id as string;
}

beforeAll(async () => {
  [team, other] = await Promise.all([makeTeam(), makeTeam()]);
  [a1, a2, b1] = await Promise.all([
    makeBlock(team.org.id, { rows: 3, vinesPerRow: 10, name: 'A North' }),
    makeBlock(team.org.id, { rows: 2, vinesPerRow: 5, name: 'A South' }),
    makeBlock(other.org.id, { rows: 2, vinesPerRow: 5, name: 'B Only' }),
  ]);
  [manager, otherManager] = await Promise.all([as(team.manager.email), as(other.manager.email)]);
});

describe('open flags not yet in a task', () => {
  it('lists free flags per block, counting run vines, and leaves out flags in an open task, closed ones and other organisations’', async () => {
    const open = await task(team.org, a1);
    const cancelled = await task(team.org, a2, { status: 'cancelled' });
    await flag(team.org, a1, 1, 1, 3, { reason: 'retrain' });
    await flag(team.org, a1, 1, 8, 8, { reason: 'replant' });
    await flag(team.org, a1, 2, 5, 5, { taskId: open });
    await flag(team.org, a1, 3, 1, 1, { status: 'closed' });
    await flag(team.org, a2, 1, 2, 2, { taskId: cancelled });
    await flag(other.org, b1, 1, 1, 4);

    const { untaskedFlags } = await desk(manager);
    // A North: the 3-vine run and the single replant (4 vines); A South: the flag whose task was cancelled.
    expect(untaskedFlags.map((b: { blockId: string; flags: number; vines: number }) => [b.blockId, b.flags, b.vines]).sort()).toEqual(
      [
        [a1.id, 2, 4],
        [a2.id, 1, 1],
      ].sort(),
    );
    const north = untaskedFlags.find((b: { blockId: string }) => b.blockId === a1.id);
    expect(north.byReason).toEqual([
      { reason: 'replant', flags: 1 },
      { reason: 'retrain', flags: 1 },
    ]);
  });

  it('links to the flags list with that block and “not in a task” chosen', async () => {
    const res = await manager.fetch(`/flags?block=${a1.id}&untasked=1`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('Flags');
  });
});

describe('overdue tasks', () => {
  it('lists open tasks due before today, not those due today, done, undated or of another organisation', async () => {
    const late = await task(team.org, a1, { dueOn: dayOffset(-2), title: 'Late one' });
    await task(team.org, a1, { dueOn: dayOffset(0), title: 'Due today' });
    await task(team.org, a1, { dueOn: dayOffset(-5), status: 'done', title: 'Done late' });
    await task(team.org, a1, { dueOn: null, title: 'No date' });
    await task(other.org, b1, { dueOn: dayOffset(-3), title: 'Not yours' });

    const { overdueTasks } = await desk(manager);
    expect(overdueTasks.map((t: { id: string }) => t.id)).toEqual([late]);
    expect(overdueTasks[0]).toMatchObject({ title: 'Late one', blockName: 'A North', dueOn: dayOffset(-2) });
  });
});

describe('blocks under a re-entry interval now', () => {
  it('lists a spray whose interval has not ended, not an expired one, a planned one or another organisation’s', async () => {
    const inForce = await spray(team.org, a1, 2, 12); // ends in 10 h
    await spray(team.org, a2, 30, 24); // ended 6 h ago
    await spray(team.org, a2, -3, 48); // applied in three hours' time
    await spray(other.org, b1, 1, 48);

    const { reentry } = await desk(manager);
    expect(reentry.map((s: { id: string }) => s.id)).toEqual([inForce]);
    expect(Date.parse(reentry[0].reentryAt) - Date.parse(reentry[0].appliedAt)).toBe(12 * HOUR);
  });
});

describe('new findings since the person last looked', () => {
  it('shows the past week on a first look, then only what arrived after the look before, act-now first, by block', async () => {
    const estateTeam = await makeTeam();
    const looker = estateTeam.manager;
    const client = await as(looker.email);
    const db = testDb();
    const estate = estateTeam.org;
    const [north, south] = await Promise.all([makeBlock(estate.id, { name: 'F North' }), makeBlock(estate.id, { name: 'F South' })]);

    await observe(estate, north, 1, 1, { severity: 3, receivedAt: ago(24 * 8) }); // before the first week
    await observe(estate, north, 1, 2, { severity: 2, receivedAt: ago(24 * 3) });
    await observe(estate, north, 1, 3, { severity: 0, kind: 'note', receivedAt: ago(24 * 3) }); // fine: not a finding

    const first = await desk(client);
    expect(first.findings.basis).toBe('first-look');
    expect(first.findings.blocks).toHaveLength(1);
    expect(first.findings.blocks[0]).toMatchObject({ blockId: north.id, actNow: 0, actThisSeason: 1, watch: 0, findings: 1 });
    expect(first.findings.blocks[0].vines).toEqual([expect.objectContaining({ row: 1, position: 2, severity: 2 })]);
    // A reload in the same sitting is still the first look's week.
    expect((await desk(client)).findings).toEqual(first.findings);

    // The sitting ends: the last look is two hours old.
    await db('desk_looks')
      .where({ user_id: looker.id, organisation_id: estate.id })
      .update({ looked_at: ago(2) });
    await observe(estate, south, 2, 4, { severity: 1, receivedAt: ago(1) });
    await observe(estate, north, 3, 7, { severity: 3, receivedAt: ago(1), observedAt: ago(24 * 5) }); // observed earlier, synced late
    await observe(estate, north, 3, 7, { severity: 1, receivedAt: ago(1) }); // same vine: counted once, at its worst
    await observe(estate, north, 2, 2, { severity: 2, receivedAt: ago(1) });
    await observe(estate, north, 2, 9, { severity: 3, receivedAt: ago(1), deleted: true });
    await observe(estate, north, 2, 10, { severity: 3, receivedAt: ago(1), status: 'closed' });
    await observe(estate, south, 1, 1, { severity: 3, receivedAt: ago(3) }); // before the last look

    const second = await desk(client);
    expect(second.findings.basis).toBe('last-look');
    expect(Math.abs(Date.parse(second.findings.since) - (Date.now() - 2 * HOUR))).toBeLessThan(60_000);
    expect(second.findings.blocks.map((b: { blockId: string }) => b.blockId)).toEqual([north.id, south.id]);
    expect(second.findings.blocks[0]).toMatchObject({ actNow: 1, actThisSeason: 1, watch: 0, findings: 3 });
    expect(second.findings.blocks[0].vines.map((v: { row: number; position: number; severity: number }) => [v.row, v.position, v.severity])).toEqual([
      [3, 7, 3],
      [2, 2, 2],
    ]);
    expect(second.findings.blocks[1]).toMatchObject({ actNow: 0, actThisSeason: 0, watch: 1, findings: 1 });

    // Within the sitting a reload shows the same.
    expect((await desk(client)).findings).toEqual(second.findings);

    // "Mark all as seen" empties it; what arrives after shows.
    expect((await client.fetch('/api/desk/seen', { method: 'POST' })).status).toBe(200);
    const seen = (await desk(client)).findings;
    expect(seen).toMatchObject({ basis: 'marked-seen', blocks: [] });
    await new Promise((r) => setTimeout(r, 20));
    await observe(estate, south, 1, 5, { severity: 2, receivedAt: new Date().toISOString() });
    const third = await desk(client);
    expect(third.findings.blocks.map((b: { blockId: string; actThisSeason: number }) => [b.blockId, b.actThisSeason])).toEqual([[south.id, 1]]);
  });

  it('keeps each person’s look apart, per organisation', async () => {
    await desk(manager);
    const looks = await testDb()('desk_looks').where({ user_id: team.manager.id });
    expect(looks.map((l: { organisation_id: string }) => l.organisation_id)).toEqual([team.org.id]);
    expect(await testDb()('desk_looks').where({ user_id: other.manager.id })).toHaveLength(0);
  });
});

describe('scouting coverage per block this season', () => {
  it('counts distinct vines with a live record but a missing-vine one over standing vines, as the season report does', async () => {
    const block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 10, name: 'A Coverage' });
    const db = testDb();
    await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 10 }).update({ status: 'missing' });
    await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 9 }).update({ status: 'replant' });
    await db('vine_positions').where({ block_id: block.id, row_number: 3, position: 8 }).update({ status: 'dead' });
    // Received at the season's start, so these records are not news to anyone on a later Desk.
    const now = `${thisYear}-01-01T00:00:30Z`;
    await observe(team.org, block, 1, 1, { severity: 0, kind: 'cane-diameter', receivedAt: now });
    await observe(team.org, block, 1, 1, { severity: 2, kind: 'weak-budbreak', receivedAt: now }); // same vine
    await observe(team.org, block, 1, 2, { severity: 1, receivedAt: now, status: 'closed' }); // closed still counts
    await observe(team.org, block, 3, 9, { severity: 0, kind: 'note', receivedAt: now });
    await observe(team.org, block, 2, 5, { severity: 3, receivedAt: now, deleted: true }); // deleted
    await observe(team.org, block, 3, 10, { severity: 3, kind: 'missing-vine', receivedAt: now }); // a hole is not a look
    await observe(team.org, block, 2, 1, { severity: 1, observedAt: `${thisYear - 1}-06-01T09:00:00Z`, receivedAt: `${thisYear - 1}-06-01T09:00:00Z` });

    const { coverage, season } = await desk(manager);
    expect(season).toBe(thisYear);
    // Hand count: vines 1/1, 1/2 and 3/9 scouted; 30 slots less one missing and one dead = 28 standing.
    expect(coverage.find((c: { blockId: string }) => c.blockId === block.id)).toEqual({ blockId: block.id, blockName: 'A Coverage', standing: 28, scouted: 3 });

    const report = await (await manager.fetch(`/api/reports/blocks/${block.id}?season=${thisYear}`)).json();
    expect(report.report.scouting.vinesScouted).toBe(3);
    expect(report.report.slots.standing).toBe(28);
  });
});

describe('undelivered mail', () => {
  it('counts the organisation’s failed and uncertain mail for its managers, as the Team page lists it', async () => {
    const before = (await desk(manager)).undeliveredMail.count;
    for (const [t, status] of [
      [team, 'failed'],
      [team, 'uncertain'],
      [team, 'sent'],
      [other, 'failed'],
    ] as const) {
      const id = randomUUID();
      await testDb()('mail_outbox').insert({
        id,
        organisation_id: t.org.id,
        user_id: t.scout.id,
        to_email: t.scout.email,
        kind: 'comment',
        dedupe_key: `desk:${id}`,
        subject: 'Test',
        text_body: 'Test',
        html_body: '<p>Test</p>',
        status,
        attempts: 1,
      });
    }
    expect((await desk(manager)).undeliveredMail).toEqual({ count: before + 2, more: false });
    const team_ = await (await manager.fetch('/api/notifications/undelivered')).json();
    expect(team_.mail).toHaveLength(before + 2);
  });
});

describe('the advisor’s Desk', () => {
  it('lists the organisations they advise with findings new since their last comment there, and no other organisation', async () => {
    const advisor = team.advisor;
    const db = testDb();
    // Advisor in the other team's organisation too; a third organisation they do not belong to.
    await db('memberships').insert({ organisation_id: other.org.id, user_id: advisor.id, role: 'advisor' });
    const stranger = await makeTeam();
    const strangerBlock = await makeBlock(stranger.org.id, { name: 'Stranger block' });
    await observe(stranger.org, strangerBlock, 1, 1, { severity: 3, receivedAt: ago(1) });

    const subject = await observe(team.org, a2, 2, 1, { severity: 1, receivedAt: ago(30) });
    await db('comments').insert({
      organisation_id: team.org.id,
      subject_kind: 'observation',
      subject_id: subject,
      body: 'Seen this',
      author_id: advisor.id,
      created_at: ago(2),
    });
    await observe(team.org, a2, 2, 2, { severity: 3, receivedAt: ago(3) }); // before the comment
    await observe(team.org, a2, 2, 3, { severity: 3, receivedAt: ago(1) });
    await observe(team.org, a2, 2, 4, { severity: 2, receivedAt: ago(1) });
    await observe(other.org, b1, 1, 1, { severity: 2, receivedAt: ago(5) });
    await observe(other.org, b1, 1, 2, { severity: 1, observedAt: `${thisYear - 1}-06-01T09:00:00Z`, receivedAt: `${thisYear - 1}-06-01T09:00:00Z` }); // last season

    const client = await as(advisor.email);
    // Working in the team's organisation (without a choice, the first by name would be open).
    expect((await client.json('/api/organisations/current', 'PUT', { organisationId: team.org.id })).status).toBe(200);
    const mine = await desk(client);
    expect(mine.untaskedFlags).toBeNull();
    expect(mine.undeliveredMail).toBeNull();
    const orgs = mine.advisorOrganisations;
    expect(orgs.map((o: { organisationId: string }) => o.organisationId).sort()).toEqual([team.org.id, other.org.id].sort());
    const here = orgs.find((o: { organisationId: string }) => o.organisationId === team.org.id);
    // Since the comment two hours ago: the two findings an hour old, across A South, not the earlier ones.
    expect(here).toMatchObject({ current: true, findings: 2, actNow: 1, blocks: 1 });
    expect(Math.abs(Date.parse(here.lastCommentAt) - (Date.now() - 2 * HOUR))).toBeLessThan(60_000);
    const there = orgs.find((o: { organisationId: string }) => o.organisationId === other.org.id);
    // No comment there yet: this season's findings (the earlier test's flags and tasks are not findings).
    expect(there).toMatchObject({ current: false, lastCommentAt: null, findings: 1, actNow: 0, since: `${thisYear}-01-01T00:00:00.000Z` });
    expect(JSON.stringify(mine)).not.toContain(stranger.org.id);
    expect(JSON.stringify(mine)).not.toContain('Stranger block');

    // Their findings in the current organisation start at the same comment.
    expect(mine.findings.basis).toBe('last-comment');
    expect(mine.findings.blocks.map((b: { blockId: string; actNow: number; actThisSeason: number }) => [b.blockId, b.actNow, b.actThisSeason])).toEqual([
      [a2.id, 1, 1],
    ]);
  });
});

describe('winter work under way', () => {
  it('lists each pass begun and not finished per block with its projected finish, for managers only', async () => {
    const finishedAt = new Date().toISOString();
    const startedAt = new Date(Date.now() - 2 * HOUR).toISOString();
    const run = (row: number, pass: string) => ({ id: randomUUID(), blockId: a1.id, row, pass, crewSize: 2, personHours: 4, startedAt, finishedAt });
    // A North: 3 rows of 10. Pruning on rows 1 and 2 (20 of 30 vines); brush removal on all three rows.
    const res = await manager.json('/api/sync/row-work', 'POST', {
      records: [run(1, 'pruning'), run(2, 'pruning'), run(1, 'brush-removal'), run(2, 'brush-removal'), run(3, 'brush-removal')],
    });
    expect(res.status, await res.clone().text()).toBe(200);

    const progress = (await desk(manager)).progress;
    expect(progress).toEqual([
      { blockId: a1.id, blockName: 'A North', pass: 'pruning', vinesDone: 20, vineCount: 30, projectedFinish: expect.stringMatching(/^\d{4}-\d{2}-\d{2}/) },
    ]);
    expect((await desk(await as(team.scout.email))).progress).toBeNull();
    expect((await desk(otherManager)).progress).toEqual([]);
  });
});

describe('roles and organisations', () => {
  it('gives scouts and crew leads the field-first Desk, and managers’ items to no one else', async () => {
    const scout = await desk(await as(team.scout.email));
    expect(scout).toMatchObject({
      role: 'scout',
      untaskedFlags: null,
      overdueTasks: null,
      findings: null,
      undeliveredMail: null,
      advisorOrganisations: null,
      myTasks: null,
    });
    expect(scout.reentry.length).toBeGreaterThan(0);

    const pruner = await as(team.pruner.email);
    const mine = [await task(team.org, a1, { dueOn: dayOffset(-1) }), await task(team.org, a1, { dueOn: dayOffset(3) })];
    await testDb()('tasks').whereIn('id', mine).update({ assignee_id: team.pruner.id });
    expect((await desk(pruner)).myTasks).toEqual({ open: 2, overdue: 1 });

    expect((await new Client().fetch('/api/desk')).status).toBe(401);
    const seen = await (await as(team.scout.email)).fetch('/api/desk/seen', { method: 'POST' });
    expect(seen.status).toBe(403);
    expect((await seen.json()).error.code).toBe('forbidden');
  });

  it('never shows another organisation’s blocks, flags, tasks, sprays or findings', async () => {
    const theirs = JSON.stringify(await desk(otherManager));
    for (const id of [a1.id, a2.id, team.org.id]) expect(theirs).not.toContain(id);
    expect(theirs).not.toContain('A North');
    const ours = JSON.stringify(await desk(manager));
    expect(ours).not.toContain(b1.id);
    expect(ours).not.toContain('B Only');
  });

  it('serves the Desk page to every role', async () => {
    for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
      const res = await (await as(team[role].email)).fetch('/desk');
      expect(res.status, role).toBe(200);
    }
  });
});
