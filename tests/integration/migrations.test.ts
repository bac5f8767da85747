import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import knex from 'knex';
import { afterAll, describe, expect, it } from 'vitest';

// Runs in its own empty database, through the same tsx script the start command uses (Knex cannot
// load TypeScript migrations inside vitest's module loader).
const admin = process.env.ADMIN_DATABASE_URL!;
const name = `vineward_migrations_${process.pid}`;
const url = admin.replace(/\/[^/]+$/, `/${name}`);

const migrate = (direction: 'up' | 'down') =>
  execFileSync(process.execPath, ['--import', 'tsx', 'scripts/migrate.ts', ...(direction === 'down' ? ['down'] : [])], {
    env: { ...process.env, DATABASE_URL: url },
    encoding: 'utf8',
  });

async function tables() {
  const db = knex({ client: 'pg', connection: url });
  try {
    const rows = await db('pg_tables').where({ schemaname: 'public' }).pluck('tablename');
    return (rows as string[]).filter((t) => !t.startsWith('knex_migrations')).sort();
  } finally {
    await db.destroy();
  }
}

afterAll(async () => {
  const db = knex({ client: 'pg', connection: admin });
  await db.raw(`drop database if exists "${name}" with (force)`);
  await db.destroy();
});

describe('migrations', () => {
  it('run up and down cleanly on an empty database, and up again', async () => {
    const db = knex({ client: 'pg', connection: admin });
    await db.raw(`create database "${name}"`);
    await db.destroy();

    migrate('up');
    expect(await tables()).toEqual(expect.arrayContaining(['organisations', 'users', 'memberships', 'invitations']));
    migrate('down');
    expect(await tables()).toEqual([]);
    migrate('up');
    expect((await tables()).length).toBeGreaterThan(4);
  });

  // Here, in a database of its own: emptying observations in the shared one would take the demo's with it.
  it('empty the grid summary with the observations when they are truncated', async () => {
    const db = knex({ client: 'pg', connection: url });
    try {
      const [org] = await db('organisations').insert({ name: 'Truncation Test Estate' }).returning('id');
      const [block] = await db('blocks')
        .insert({
          organisation_id: org.id,
          name: 'T',
          variety: 'Test Noir',
          training_system: 'cane',
          row_spacing_m: 2.5,
          vine_spacing_m: 1.2,
          row_count: 1,
          vines_per_row: 1,
        })
        .returning('id');
      await db('block_rows').insert({ block_id: block.id, row_number: 1, vine_count: 1 });
      const [slot] = await db('vine_positions').insert({ block_id: block.id, row_number: 1, position: 1 }).returning('id');
      await db('observations').insert({
        id: randomUUID(),
        organisation_id: org.id,
        block_id: block.id,
        position_id: slot.id,
        row_number: 1,
        position: 1,
        kind: 'note',
        observed_at: new Date(),
        payload_sha256: 'truncate-test',
      });
      const rows = async () => [(await db('grid_vines').count({ n: '*' }))[0]!.n, (await db('grid_counts').count({ n: '*' }))[0]!.n].map(Number);
      expect(await rows()).toEqual([1, 1]);
      await db.raw('truncate observations cascade');
      expect(await rows()).toEqual([0, 0]);
    } finally {
      await db.destroy();
    }
  });
});
