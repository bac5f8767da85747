import type { Knex } from 'knex';

/**
 * Managers revoke invitations that were not accepted yet: the row stays (it still counts against
 * the manager's allowance of invitations per day) with who revoked it and when, and its link stops
 * working. The index serves that allowance: a manager's invitations of the last day.
 */
export async function up(knex: Knex) {
  await knex.schema.alterTable('invitations', (t) => {
    t.timestamp('revoked_at', { useTz: true });
    t.uuid('revoked_by').references('users.id').onDelete('SET NULL');
    t.index(['invited_by', 'created_at'], 'invitations_invited_by_created_idx');
  });
}

export async function down(knex: Knex) {
  await knex.schema.alterTable('invitations', (t) => {
    t.dropIndex(['invited_by', 'created_at'], 'invitations_invited_by_created_idx');
    t.dropColumn('revoked_by');
    t.dropColumn('revoked_at');
  });
}
