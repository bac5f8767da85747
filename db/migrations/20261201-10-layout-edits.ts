import type { Knex } from 'knex';

/**
 * Layout edits. Renumbering a block's rows (a new first row) moves its slots with them, so the
 * slots' foreign key to their row follows updates. Editing a layout deletes slots in bulk, and
 * each deleted slot makes PostgreSQL look for observations on it: index that lookup.
 */
export async function up(knex: Knex) {
  await knex.raw(`alter table vine_positions drop constraint vine_positions_block_id_row_number_foreign,
    add constraint vine_positions_block_id_row_number_foreign foreign key (block_id, row_number)
      references block_rows (block_id, row_number) on update cascade on delete cascade`);
  await knex.raw('create index if not exists observations_position_id_index on observations (position_id)');
}

export async function down(knex: Knex) {
  await knex.raw('drop index if exists observations_position_id_index');
  await knex.raw(`alter table vine_positions drop constraint vine_positions_block_id_row_number_foreign,
    add constraint vine_positions_block_id_row_number_foreign foreign key (block_id, row_number)
      references block_rows (block_id, row_number) on delete cascade`);
}
