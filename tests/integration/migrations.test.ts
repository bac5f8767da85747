import { execFileSync } from 'node:child_process';
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
});
