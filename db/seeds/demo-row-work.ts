/**
 * A season of row work on the demo estate, by three crews: the demo pruner's and two more crew
 * leads' (invented people). Upper Terrace, Schoolhouse Slope and North Bench are on or ahead of
 * the season report's estimate; Creek Flat, the 150 × 150 block, is behind: its crews go slower
 * than the estimate's minutes per vine and have pruned only its first rows. The work lies in the
 * weeks before the seed runs, so the projections read as the current season's. Ids derive from
 * each record's meaning, so a second run inserts nothing new.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { DEMO_USERS } from './demo';
import { DEMO_BLOCKS } from './demo-layout';
import { demoId } from './demo-observations';

export const DEMO_CREW_LEADS = [
  { id: '8a6b2c10-1d4e-4f3a-8b7c-000000000005', email: 'crew.north@example.com', name: 'Maren Solvik' },
  { id: '8a6b2c10-1d4e-4f3a-8b7c-000000000006', email: 'crew.creek@example.com', name: 'Tavi Okonedo' },
] as const;

const hash = (value: unknown) => createHash('sha256').update(JSON.stringify(value)).digest('hex');

interface Plan {
  block: string;
  lead: string;
  pass: 'pruning' | 'brush-removal' | 'tying';
  rows: [number, number];
  /** Vines per person-hour. */
  pace: number;
  crew: number;
  /** Days before today the first row was done. */
  startDaysAgo: number;
  rowsPerDay: number;
  /** The last row stops at this vine: work in progress. */
  lastRowTo?: number;
}

// Cane-pruned blocks estimate 1.75 min a vine (about 34 vines a person-hour), spur-pruned 1 min (60).
// A function, not a constant: demo.ts imports this file before its own DEMO_USERS exists.
const plans = (rosa: string, maren: string, tavi: string): Plan[] => [
  { block: 'Upper Terrace', lead: rosa, pass: 'pruning', rows: [1, 20], pace: 38, crew: 4, startDaysAgo: 20, rowsPerDay: 2, lastRowTo: 30 },
  { block: 'Upper Terrace', lead: rosa, pass: 'brush-removal', rows: [1, 16], pace: 120, crew: 2, startDaysAgo: 18, rowsPerDay: 2 },
  { block: 'Upper Terrace', lead: rosa, pass: 'tying', rows: [1, 12], pace: 70, crew: 3, startDaysAgo: 16, rowsPerDay: 2 },
  { block: 'Schoolhouse Slope', lead: maren, pass: 'pruning', rows: [1, 34], pace: 66, crew: 5, startDaysAgo: 24, rowsPerDay: 3 },
  { block: 'Schoolhouse Slope', lead: maren, pass: 'brush-removal', rows: [1, 28], pace: 150, crew: 2, startDaysAgo: 21, rowsPerDay: 3 },
  { block: 'North Bench', lead: maren, pass: 'pruning', rows: [1, 12], pace: 40, crew: 3, startDaysAgo: 28, rowsPerDay: 3 },
  { block: 'North Bench', lead: maren, pass: 'brush-removal', rows: [1, 12], pace: 130, crew: 2, startDaysAgo: 26, rowsPerDay: 4 },
  { block: 'North Bench', lead: rosa, pass: 'tying', rows: [1, 9], pace: 75, crew: 2, startDaysAgo: 22, rowsPerDay: 3 },
  // Behind: thick old canes and a short crew, well under the estimate's pace.
  { block: 'Creek Flat', lead: tavi, pass: 'pruning', rows: [1, 22], pace: 21, crew: 6, startDaysAgo: 22, rowsPerDay: 1, lastRowTo: 90 },
  { block: 'Creek Flat', lead: tavi, pass: 'brush-removal', rows: [1, 10], pace: 110, crew: 2, startDaysAgo: 15, rowsPerDay: 1 },
];

export async function seedDemoRowWork(knex: Knex, organisationId: string) {
  await knex('users')
    .insert(DEMO_CREW_LEADS.map((c) => ({ id: c.id, email: c.email, name: c.name })))
    .onConflict('id')
    .ignore();
  await knex('memberships')
    .insert(DEMO_CREW_LEADS.map((c) => ({ organisation_id: organisationId, user_id: c.id, role: 'pruner' })))
    .onConflict(['organisation_id', 'user_id'])
    .ignore();
  await knex('organisations').where({ id: organisationId, hourly_rate: null, piece_rate_per_vine: null }).update({ pay_basis: 'hourly', hourly_rate: 28 });

  const rosa = DEMO_USERS.find((u) => u.role === 'pruner')!.id;
  const [maren, tavi] = DEMO_CREW_LEADS.map((c) => c.id) as [string, string];
  const today = new Date();
  today.setUTCHours(0, 0, 0, 0);
  const records = [];
  for (const plan of plans(rosa, maren, tavi)) {
    const block = DEMO_BLOCKS.find((b) => b.name === plan.block)!;
    for (let row = plan.rows[0]; row <= plan.rows[1]; row++) {
      const i = row - plan.rows[0];
      const vines = block.shortRows?.[row] ?? block.vinesPerRow;
      const last = row === plan.rows[1] && plan.lastRowTo !== undefined;
      const covered = last ? plan.lastRowTo! : vines;
      const personHours = Math.round((covered / plan.pace) * 100) / 100;
      const day = new Date(today.getTime() - (plan.startDaysAgo - Math.floor(i / plan.rowsPerDay)) * 24 * 3600 * 1000);
      const startHour = 7 + (i % plan.rowsPerDay) * Math.min(4, personHours / plan.crew);
      const startedAt = new Date(day.getTime() + startHour * 3600 * 1000);
      const finishedAt = new Date(startedAt.getTime() + (personHours / plan.crew) * 3600 * 1000);
      const record = {
        blockId: block.id,
        row,
        pass: plan.pass,
        fromPosition: last ? 1 : null,
        toPosition: last ? covered : null,
        crewSize: plan.crew,
        personHours,
        startedAt: startedAt.toISOString(),
        finishedAt: finishedAt.toISOString(),
        note: last ? 'Stopped for the day mid-row.' : '',
      };
      records.push({
        id: demoId(`row-work:${plan.block}:${plan.pass}:${row}`),
        organisation_id: organisationId,
        block_id: block.id,
        row_number: row,
        pass: plan.pass,
        from_position: record.fromPosition,
        to_position: record.toPosition,
        crew_size: plan.crew,
        person_hours: personHours,
        started_at: record.startedAt,
        finished_at: record.finishedAt,
        note: record.note,
        recorded_by: plan.lead,
        payload_sha256: hash(record),
      });
    }
  }
  await knex('row_work').insert(records).onConflict('id').ignore();
}
