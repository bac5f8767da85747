/**
 * Work on the demo estate: a few vines flagged for extra care, one task made from them for the
 * pruner, a thread from the advisor, and the manager's pruning checks on the pruner's work. Ids are
 * derived from each row's meaning, so a second run inserts nothing new.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { observationSeverity, type PruningCheckData } from '../../lib/viticulture';
import { DEMO_USERS } from './demo';
import { DEMO_BLOCKS } from './demo-layout';
import { demoId } from './demo-observations';

const user = (role: 'manager' | 'scout' | 'pruner' | 'advisor') => DEMO_USERS.find((u) => u.role === role)!.id;
const hash = (value: unknown) => createHash('sha256').update(JSON.stringify(value)).digest('hex');

interface DemoFlag {
  key: string;
  block: string;
  row: number;
  position: number;
  toPosition?: number;
  reason: string;
  note: string;
  day: string;
  by: 'scout' | 'pruner' | 'manager';
}

const FLAGS: DemoFlag[] = [
  {
    key: 'ut-retrain',
    block: 'Upper Terrace',
    row: 3,
    position: 20,
    toPosition: 24,
    reason: 'retrain',
    note: 'Cordon gone over the wire; lay down new canes.',
    day: '2026-11-04',
    by: 'pruner',
  },
  {
    key: 'ut-trunk',
    block: 'Upper Terrace',
    row: 3,
    position: 31,
    reason: 'trunk-renewal',
    note: 'Trunk split at the graft; keep the low sucker.',
    day: '2026-11-04',
    by: 'pruner',
  },
  { key: 'ut-replant', block: 'Upper Terrace', row: 12, position: 5, reason: 'replant', note: '', day: '2026-10-21', by: 'scout' },
  {
    key: 'cf-lighter',
    block: 'Creek Flat',
    row: 140,
    position: 3,
    toPosition: 6,
    reason: 'lighter-bud-load',
    note: 'Weak push last spring in the low corner.',
    day: '2026-10-28',
    by: 'scout',
  },
  {
    key: 'ns-injured',
    block: 'Schoolhouse Slope',
    row: 2,
    position: 14,
    reason: 'remove-injured-wood',
    note: 'Hail-split spurs.',
    day: '2026-11-12',
    by: 'pruner',
  },
];

export async function seedDemoWork(knex: Knex, organisationId: string) {
  const blockId = (name: string) => DEMO_BLOCKS.find((b) => b.name === name)!.id;
  const slot = async (block: string, row: number, position: number) =>
    (
      await knex('vine_positions')
        .where({ block_id: blockId(block), row_number: row, position })
        .first('id')
    )?.id as string | undefined;

  for (const f of FLAGS) {
    const positionId = await slot(f.block, f.row, f.position);
    if (!positionId) continue;
    const flaggedAt = `${f.day}T09:30:00Z`;
    await knex('flags')
      .insert({
        id: demoId(`flag:${f.key}`),
        organisation_id: organisationId,
        block_id: blockId(f.block),
        position_id: positionId,
        row_number: f.row,
        position: f.position,
        to_position: f.toPosition ?? f.position,
        reason: f.reason,
        note: f.note,
        flagged_at: flaggedAt,
        flagged_by: user(f.by),
        payload_sha256: hash(f),
      })
      .onConflict('id')
      .ignore();
  }

  // The retraining run, given to the pruner, two vines already done.
  const taskId = demoId('task:ut-retrain');
  const due = new Date(Date.now() + 10 * 24 * 3600 * 1000).toISOString().slice(0, 10);
  const inserted = await knex('tasks')
    .insert({
      id: taskId,
      organisation_id: organisationId,
      block_id: blockId('Upper Terrace'),
      title: 'Retrain, row 3',
      note: 'Tie the new canes before budbreak.',
      assignee_id: user('pruner'),
      assigned_at: knex.fn.now(),
      due_on: due,
      priority: 'high',
      created_by: user('manager'),
    })
    .onConflict('id')
    .ignore()
    .returning('id');
  if (inserted.length) {
    const slots = await knex('vine_positions')
      .where({ block_id: blockId('Upper Terrace'), row_number: 3 })
      .whereBetween('position', [20, 24])
      .orderBy('position')
      .select('id', 'position');
    await knex('task_items').insert(
      slots.map((s: { id: string; position: number }, i: number) => ({
        task_id: taskId,
        position_id: s.id,
        row_number: 3,
        position: s.position,
        sequence: i + 1,
        ...(i < 2 ? { status: 'done', done_at: '2026-11-25T10:00:00Z', done_by: user('pruner'), note: i === 0 ? 'Two canes laid down.' : '' } : {}),
      })),
    );
    await knex('flags')
      .where({ id: demoId('flag:ut-retrain') })
      .update({ task_id: taskId });
  }

  const trunkVine = await slot('Upper Terrace', 3, 31);
  const comments = [
    {
      key: 'advice-trunk',
      kind: 'vine',
      subject: trunkVine,
      position: trunkVine,
      by: 'advisor',
      body: 'Renew from the low sucker and keep it tied straight this spring; take the old trunk out next winter.',
      at: '2026-11-05T18:05:00Z',
    },
    {
      key: 'task-question',
      kind: 'task',
      subject: taskId,
      position: null,
      by: 'pruner',
      body: 'Vines 22 and 23 have no cane long enough yet. Leave them for the next pass?',
      at: '2026-11-25T15:12:00Z',
    },
    {
      key: 'task-answer',
      kind: 'task',
      subject: taskId,
      position: null,
      by: 'manager',
      body: 'Yes, leave two spurs on each and we come back in spring.',
      at: '2026-11-26T07:40:00Z',
    },
  ] as const;
  for (const c of comments) {
    if (!c.subject) continue;
    await knex('comments')
      .insert({
        id: demoId(`comment:${c.key}`),
        organisation_id: organisationId,
        subject_kind: c.kind,
        subject_id: c.subject,
        position_id: c.position,
        body: c.body,
        author_id: user(c.by),
        created_at: c.at,
      })
      .onConflict('id')
      .ignore();
  }

  // Early in this winter's pruning the manager checks the pruner's work on a sample of Upper Terrace
  // against the block's 28 buds.
  const checks: [number, number, Omit<PruningCheckData, 'prunedBy'>][] = [
    [4, 8, { canesKept: 2, budsOnCanes: 24, renewalSpurs: 2, budTarget: 28 }],
    [4, 26, { canesKept: 2, budsOnCanes: 28, renewalSpurs: 2, budTarget: 28 }],
    [6, 12, { canesKept: 2, budsOnCanes: 30, renewalSpurs: 1, budTarget: 28 }],
    [8, 40, { canesKept: 2, budsOnCanes: 32, renewalSpurs: 2, budTarget: 28 }],
    [10, 17, { canesKept: 3, budsOnCanes: 36, renewalSpurs: 2, budTarget: 28 }],
    [14, 33, { canesKept: 2, budsOnCanes: 26, renewalSpurs: 2, budTarget: 28 }],
  ];
  for (const [row, position, check] of checks) {
    const positionId = await slot('Upper Terrace', row, position);
    if (!positionId) continue;
    const data: PruningCheckData = { prunedBy: user('pruner'), ...check };
    await knex('observations')
      .insert({
        id: demoId(`observation:pruning-check:${row}:${position}`),
        organisation_id: organisationId,
        block_id: blockId('Upper Terrace'),
        position_id: positionId,
        row_number: row,
        position,
        kind: 'pruning-check',
        data: JSON.stringify(data),
        note: '',
        observed_at: new Date(Date.now() - (2 + (row % 3)) * 24 * 3600 * 1000).toISOString(),
        recorded_by: user('manager'),
        severity: observationSeverity('pruning-check', data),
        payload_sha256: hash(data),
      })
      .onConflict('id')
      .ignore();
  }
}
