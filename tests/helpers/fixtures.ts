/**
 * Builds people and organisations straight in the test database. Every call makes fresh,
 * unique rows, so test files never depend on each other or on the demo data.
 */
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import knex, { type Knex } from 'knex';
import type { Role } from '@/lib/roles';

let instance: Knex | undefined;

export function testDb() {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
  instance ??= knex({ client: 'pg', connection: process.env.DATABASE_URL, pool: { min: 0, max: 4 } });
  return instance;
}

export async function closeTestDb() {
  await instance?.destroy();
  instance = undefined;
}

export const PASSWORD = 'correct horse battery';
let hash: string | undefined;

export const uniqueEmail = (label: string) => `${label}-${randomUUID().slice(0, 8)}@example.com`;

export async function makeOrganisation(name = `Test estate ${randomUUID().slice(0, 6)}`) {
  const [org] = await testDb()('organisations').insert({ name }).returning('*');
  return org as { id: string; name: string };
}

export async function makeUser(label = 'person') {
  hash ??= await bcrypt.hash(PASSWORD, 4);
  const [user] = await testDb()('users')
    .insert({ email: uniqueEmail(label), name: `Test ${label}`, password_hash: hash })
    .returning('*');
  return user as { id: string; email: string; name: string };
}

export async function makeMember(organisationId: string, role: Role) {
  const user = await makeUser(role);
  await testDb()('memberships').insert({ organisation_id: organisationId, user_id: user.id, role });
  return user;
}

/** An organisation with one member of each role. */
export async function makeTeam() {
  const org = await makeOrganisation();
  const [manager, scout, pruner, advisor] = await Promise.all((['manager', 'scout', 'pruner', 'advisor'] as const).map((r) => makeMember(org.id, r)));
  return { org, manager: manager!, scout: scout!, pruner: pruner!, advisor: advisor! };
}

/** A small block with every slot planted, built straight in the database. */
export async function makeBlock(organisationId: string, o: { rows?: number; vinesPerRow?: number; name?: string } = {}) {
  const rows = o.rows ?? 3;
  const vinesPerRow = o.vinesPerRow ?? 10;
  const db = testDb();
  const [block] = await db('blocks')
    .insert({
      organisation_id: organisationId,
      name: o.name ?? `Block ${randomUUID().slice(0, 6)}`,
      variety: 'Test Noir',
      training_system: 'cane',
      row_spacing_m: 2.5,
      vine_spacing_m: 1.2,
      row_count: rows,
      vines_per_row: vinesPerRow,
      vines_per_panel: 5,
    })
    .returning('*');
  await db('block_rows').insert(Array.from({ length: rows }, (_, i) => ({ block_id: block.id, row_number: i + 1, vine_count: vinesPerRow })));
  await db.raw(
    `insert into vine_positions (block_id, row_number, position)
     select ?, r, p from generate_series(1, ?) r, generate_series(1, ?) p`,
    [block.id, rows, vinesPerRow],
  );
  return block as { id: string; name: string; organisation_id: string };
}
