import type { Knex } from 'knex';

/**
 * When each person last looked at the Desk of each organisation. `since` is the start of what the
 * Desk shows as new: it moves on to the previous look only once a sitting is over, so reloading
 * the page during the morning round does not empty the list (lib/server/queries/desk.ts).
 * The two indexes serve the Desk's reads: findings received since a moment, and a person's last
 * comment in an organisation (the advisor's Desk).
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('desk_looks', (t) => {
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.timestamp('looked_at', { useTz: true }).notNullable();
    t.timestamp('since', { useTz: true }).notNullable();
    // What `since` is: the first look's week before, the look before, or a "mark all as seen".
    t.text('since_basis').notNullable();
    t.primary(['user_id', 'organisation_id']);
  });
  await knex.raw(`alter table desk_looks add constraint desk_looks_basis_check check (since_basis in ('first-look', 'last-look', 'marked-seen'))`);
  await knex.raw(`create index observations_findings_received_idx on observations (organisation_id, received_at)
    include (block_id, row_number, position, kind, severity, status, observed_at) where deleted_at is null and severity >= 1`);
  await knex.raw('create index comments_author_idx on comments (author_id, organisation_id, created_at)');
}

export async function down(knex: Knex) {
  await knex.raw('drop index if exists comments_author_idx');
  await knex.raw('drop index if exists observations_findings_received_idx');
  await knex.schema.dropTableIfExists('desk_looks');
}
