/**
 * The demo scenario: an invented estate and its team. Nothing here is a real person, vineyard or
 * place; every address is on the reserved example.com domain. Safe to run on every start: rows
 * have fixed ids and existing ones are left alone.
 */
import bcrypt from 'bcryptjs';
import { envSetting } from '../../lib/env';
import type { Knex } from 'knex';
import { seedDemoLayout } from './demo-layout';
import { seedDemoMeasurements } from './demo-measurements';
import { seedDemoObservations, type DemoObservationOptions } from './demo-observations';
import { seedDemoRowWork } from './demo-row-work';
import { seedDemoWork } from './demo-work';

export const DEMO_PASSWORD = 'vineward-demo';

export const DEMO_ORG_ID = '5d1f0a3e-7c2b-4e8a-9b61-0a0d2c9e4f01';
export const DEMO_SECOND_ORG_ID = '5d1f0a3e-7c2b-4e8a-9b61-0a0d2c9e4f02';

export const DEMO_USERS = [
  { id: '8a6b2c10-1d4e-4f3a-8b7c-000000000001', email: 'manager@example.com', name: 'Ines Calloway', role: 'manager' },
  { id: '8a6b2c10-1d4e-4f3a-8b7c-000000000002', email: 'scout@example.com', name: 'Teo Marwick', role: 'scout' },
  { id: '8a6b2c10-1d4e-4f3a-8b7c-000000000003', email: 'pruner@example.com', name: 'Rosa Quintal', role: 'pruner' },
  { id: '8a6b2c10-1d4e-4f3a-8b7c-000000000004', email: 'advisor@example.com', name: 'Dr. Anselm Pryde', role: 'advisor' },
] as const;

export async function seedDemo(knex: Knex, options: DemoObservationOptions = {}) {
  await knex('organisations')
    .insert([
      { id: DEMO_ORG_ID, name: 'Ninefold Ridge Estate', unit_system: 'metric' },
      { id: DEMO_SECOND_ORG_ID, name: 'Hollowmere Growers', unit_system: 'imperial' },
    ])
    .onConflict('id')
    .ignore();

  const existing = await knex('users')
    .whereIn(
      'id',
      DEMO_USERS.map((u) => u.id),
    )
    .pluck('id');
  if (existing.length < DEMO_USERS.length) {
    const hash = await bcrypt.hash(DEMO_PASSWORD, envSetting('BCRYPT_COST', options.env));
    await knex('users')
      .insert(DEMO_USERS.map((u) => ({ id: u.id, email: u.email, name: u.name, password_hash: hash, email_verified: knex.fn.now() })))
      .onConflict('id')
      .ignore();
  }

  await knex('memberships')
    .insert([
      ...DEMO_USERS.map((u) => ({ organisation_id: DEMO_ORG_ID, user_id: u.id, role: u.role })),
      // The advisor consults for a second grower too, so the organisation switcher has a use.
      { organisation_id: DEMO_SECOND_ORG_ID, user_id: DEMO_USERS[3].id, role: 'advisor' },
    ])
    .onConflict(['organisation_id', 'user_id'])
    .ignore();

  await seedDemoLayout(knex, DEMO_ORG_ID);
  await seedDemoObservations(knex, DEMO_ORG_ID, options);
  await seedDemoWork(knex, DEMO_ORG_ID);
  await seedDemoMeasurements(knex, DEMO_ORG_ID);
  await seedDemoRowWork(knex, DEMO_ORG_ID);
}
