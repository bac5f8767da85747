import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GRID_KINDS } from '@/lib/grid/cells';
import { DEFAULT_GRID_FILTERS, type GridFilters } from '@/lib/grid/filters';
import { listGridBlocks, loadGrid } from '@/lib/server/queries/grid';
import { OBSERVATION_KINDS } from '@/lib/viticulture';
import { closeTestDb, makeBlock, makeTeam, testDb } from '../helpers/fixtures';

afterAll(closeTestDb);

const ROWS = 3;
const VINES = 5;
type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;

beforeAll(async () => {
  team = await makeTeam();
});

/** Views the grid offers: every status, with and without kinds, dates, a person and flags. */
function views(by: string): GridFilters[] {
  const base = DEFAULT_GRID_FILTERS;
  return [
    base,
    { ...base, status: 'closed' },
    { ...base, status: 'all' },
    { ...base, kind: ['trunk-injury'] },
    { ...base, kind: ['note', 'weak-budbreak'], status: 'all' },
    { ...base, kind: ['cane-injury', 'pruning-check'], status: 'closed' },
    { ...base, flagged: true },
    { ...base, flagged: true, kind: ['shade-cane'], status: 'all' },
    { ...base, from: '2026-03-01', to: '2026-03-31' },
    { ...base, by, status: 'all' },
  ];
}

interface Obs {
  id: string;
  row: number;
  position: number;
  kind: string;
  severity: number;
  status: 'open' | 'closed';
  day: number;
  byScout: boolean;
}

const obsArb = fc.record({
  row: fc.integer({ min: 1, max: ROWS }),
  position: fc.integer({ min: 1, max: VINES }),
  kind: fc.constantFrom(...OBSERVATION_KINDS),
  severity: fc.integer({ min: 0, max: 3 }),
  status: fc.constantFrom('open' as const, 'closed' as const),
  day: fc.integer({ min: 0, max: 89 }),
  byScout: fc.boolean(),
});

/** What may happen to a stored observation later: closed or reopened, re-rated, moved, deleted, edited. */
const changeArb = fc.record({
  pick: fc.nat(),
  what: fc.constantFrom('close', 'reopen', 'rate', 'delete', 'undelete', 'erase', 'move', 'note', 'kind', 'redate'),
  severity: fc.integer({ min: 0, max: 3 }),
  position: fc.integer({ min: 1, max: VINES }),
});

type Change = typeof changeArb extends fc.Arbitrary<infer T> ? T : never;

async function insert(db: Knex, block: { id: string }, slots: Map<string, string>, batch: Obs[]) {
  if (batch.length === 0) return;
  await db('observations').insert(
    batch.map((o) => ({
      id: o.id,
      organisation_id: team.org.id,
      block_id: block.id,
      position_id: slots.get(`${o.row}:${o.position}`),
      row_number: o.row,
      position: o.position,
      kind: o.kind,
      observed_at: new Date(Date.UTC(2026, 1, 1 + o.day, 23, 30)),
      recorded_by: o.byScout ? team.scout.id : team.pruner.id,
      severity: o.severity,
      status: o.status,
      payload_sha256: 'summary-test',
    })),
  );
}

async function change(db: Knex, slots: Map<string, string>, ids: string[], c: Change) {
  const id = ids[c.pick % ids.length]!;
  const row = db('observations').where({ id });
  switch (c.what) {
    case 'close':
      return row.update({ status: 'closed', closed_at: db.fn.now() });
    case 'reopen':
      return row.update({ status: 'open', closed_at: null });
    case 'rate':
      return row.update({ severity: c.severity });
    case 'delete':
      return row.update({ deleted_at: db.fn.now() });
    case 'undelete':
      return row.update({ deleted_at: null });
    case 'erase':
      return row.delete();
    case 'move': {
      const at = await row.clone().first('row_number');
      if (!at) return;
      return row.update({ position: c.position, position_id: slots.get(`${at.row_number}:${c.position}`) });
    }
    case 'note':
      return row.update({ note: 'edited', data: JSON.stringify({ edited: true }) });
    case 'kind':
      return row.update({ kind: OBSERVATION_KINDS[c.severity * 2]! });
    case 'redate':
      return row.update({ observed_at: new Date(Date.UTC(2026, 2, 1 + c.severity * 10)) });
  }
}

async function expectSourcesAgree(db: Knex, blockId: string) {
  for (const view of views(team.scout.id)) {
    // As the route reads it (the summary wherever it can answer) against the observations alone.
    const [asRouted, fromObservations] = await Promise.all([
      loadGrid(db, team.org.id, blockId, view),
      loadGrid(db, team.org.id, blockId, view, 'observations'),
    ]);
    expect(asRouted, JSON.stringify(view)).toEqual(fromObservations);
  }
}

describe('the grid summary kept by triggers', () => {
  it('numbers the kinds as GRID_KINDS does, and refuses a kind it does not know', async () => {
    const db = testDb();
    const { rows } = await db.raw('select k, grid_kind_index(k) as i from unnest(?::text[]) k', [[...GRID_KINDS]]);
    expect(rows.map((r: { i: number }) => r.i)).toEqual(GRID_KINDS.map((_, i) => i));
    await expect(db.raw(`select grid_kind_index('frost-scar')`)).rejects.toThrow(/does not know the observation kind frost-scar/);
  });

  it('gives the same grid and counts as the observations after any inserts, closings, edits, moves and deletes', async () => {
    const db = testDb();
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.array(obsArb, { maxLength: 12 }), { minLength: 1, maxLength: 4 }),
        fc.array(changeArb, { maxLength: 12 }),
        fc.boolean(),
        async (batches, changes, flagged) => {
          const block = await makeBlock(team.org.id, { rows: ROWS, vinesPerRow: VINES });
          const slots = new Map<string, string>(
            (await db('vine_positions').where({ block_id: block.id }).select('id', 'row_number', 'position')).map((s) => [
              `${s.row_number}:${s.position}`,
              s.id,
            ]),
          );
          if (flagged) {
            await db('flags').insert({
              id: randomUUID(),
              organisation_id: team.org.id,
              block_id: block.id,
              position_id: slots.get('1:2'),
              row_number: 1,
              position: 2,
              to_position: 4,
              reason: 'trunk-renewal',
              flagged_at: new Date(),
              payload_sha256: 'summary-test',
            });
          }
          const ids: string[] = [];
          for (const batch of batches) {
            const rows = batch.map((o) => ({ ...o, id: randomUUID() }));
            await insert(db, block, slots, rows);
            ids.push(...rows.map((r) => r.id));
          }
          await expectSourcesAgree(db, block.id);
          if (ids.length === 0) return;
          for (const c of changes) await change(db, slots, ids, c);
          await expectSourcesAgree(db, block.id);
        },
      ),
      { numRuns: 20 },
    );
  });

  it('stays right when two writers record on the same vines at once', async () => {
    const db = testDb();
    const block = await makeBlock(team.org.id, { rows: 1, vinesPerRow: 4 });
    const slots = await db('vine_positions').where({ block_id: block.id }).orderBy('position').pluck('id');
    const row = (positionId: string, position: number, severity: number, kind: string) => ({
      id: randomUUID(),
      organisation_id: team.org.id,
      block_id: block.id,
      position_id: positionId,
      row_number: 1,
      position,
      kind,
      observed_at: new Date('2026-03-02T08:00:00Z'),
      recorded_by: team.scout.id,
      severity,
      payload_sha256: 'summary-test',
    });
    const first = await db.transaction();
    const second = await db.transaction();
    try {
      // The first writer holds its new rows uncommitted while the second writes on the same vines.
      await first('observations').insert([row(slots[0], 1, 1, 'trunk-injury'), row(slots[1], 2, 3, 'note')]);
      // A Knex query runs once asked for its result: then() sends it now, while the first still holds.
      const waiting = second('observations')
        .insert([row(slots[1], 2, 2, 'trunk-injury'), row(slots[0], 1, 3, 'weak-budbreak')])
        .then(() => undefined);
      await new Promise((resolve) => setTimeout(resolve, 200));
      await first.commit();
      await waiting;
      await second.commit();
    } finally {
      if (!first.isCompleted()) await first.rollback();
      if (!second.isCompleted()) await second.rollback();
    }
    // And a closing racing with a new record on the same vine.
    const closing = await db.transaction();
    const adding = await db.transaction();
    try {
      await closing('observations').where({ position_id: slots[1], kind: 'note' }).update({ status: 'closed' });
      const waiting = adding('observations')
        .insert(row(slots[1], 2, 1, 'shade-cane'))
        .then(() => undefined);
      await new Promise((resolve) => setTimeout(resolve, 200));
      await closing.commit();
      await waiting;
      await adding.commit();
    } finally {
      if (!closing.isCompleted()) await closing.rollback();
      if (!adding.isCompleted()) await adding.rollback();
    }
    const grid = await loadGrid(db, team.org.id, block.id, DEFAULT_GRID_FILTERS);
    // Codes are slot × 5 + level, level = worst open severity + 1: vine 1 urgent (3), vine 2 the open trunk injury (2).
    expect(grid.cells).toEqual([[4, 3, 0, 0]]);
    expect(grid.vinesScouted).toBe(2);
    await expectSourcesAgree(db, block.id);
  });

  it('goes with a block or an organisation deleted with its records', async () => {
    const db = testDb();
    const gone = await makeTeam();
    const recorded = async () => {
      const block = await makeBlock(gone.org.id, { rows: 1, vinesPerRow: 2 });
      const slot = await db('vine_positions').where({ block_id: block.id, position: 1 }).first('id');
      await db('observations').insert({
        id: randomUUID(),
        organisation_id: gone.org.id,
        block_id: block.id,
        position_id: slot.id,
        row_number: 1,
        position: 1,
        kind: 'trunk-injury',
        observed_at: new Date('2026-03-02T08:00:00Z'),
        severity: 2,
        payload_sha256: 'summary-test',
      });
      expect(await db('grid_vines').where({ block_id: block.id }).count({ n: '*' })).toEqual([{ n: '1' }]);
      return block;
    };
    const summaryRows = async (blockId: string) =>
      Number((await db('grid_vines').where({ block_id: blockId }).count({ n: '*' }))[0]!.n) +
      Number((await db('grid_counts').where({ block_id: blockId }).count({ n: '*' }))[0]!.n);
    const block = await recorded();
    await db('blocks').where({ id: block.id }).delete();
    expect(await summaryRows(block.id)).toBe(0);
    const another = await recorded();
    await db('organisations').where({ id: gone.org.id }).delete();
    expect(await summaryRows(another.id)).toBe(0);
  });

  it('counts vines needing action per block for the grid picker', async () => {
    const db = testDb();
    const block = await makeBlock(team.org.id, { rows: 1, vinesPerRow: 3, name: `Picker ${randomUUID().slice(0, 6)}` });
    const slots = new Map<string, string>(
      (await db('vine_positions').where({ block_id: block.id }).select('id', 'row_number', 'position')).map((s) => [`${s.row_number}:${s.position}`, s.id]),
    );
    const obs = (position: number, severity: number, status: 'open' | 'closed'): Obs => ({
      id: randomUUID(),
      row: 1,
      position,
      kind: 'trunk-injury',
      severity,
      status,
      day: 3,
      byScout: true,
    });
    await insert(db, block, slots, [obs(1, 3, 'open'), obs(1, 1, 'open'), obs(2, 2, 'open'), obs(3, 3, 'closed')]);
    const picked = (await listGridBlocks(db, team.org.id)).find((b) => b.id === block.id);
    expect(picked).toMatchObject({ actVines: 2, urgentVines: 1 });
  });
});
