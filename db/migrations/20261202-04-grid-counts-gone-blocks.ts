import type { Knex } from 'knex';

/**
 * Deleting a block (or an organisation) deletes its observations through the foreign keys, and
 * the grid's trigger then takes their counts off grid_counts. When the block's own count rows are
 * already gone, that would insert negative counts for a block that no longer exists, and the
 * foreign key refuses the whole deletion. A count for a block that is gone is skipped instead.
 */
export async function up(knex: Knex) {
  await knex.raw(`create function grid_counts_skip_gone_blocks() returns trigger language plpgsql as $$
    begin
      if not exists (select 1 from blocks where id = new.block_id) then
        return null;
      end if;
      return new;
    end $$`);
  await knex.raw(`create trigger grid_counts_skip_gone_blocks before insert on grid_counts
    for each row execute function grid_counts_skip_gone_blocks()`);
}

export async function down(knex: Knex) {
  await knex.raw('drop trigger if exists grid_counts_skip_gone_blocks on grid_counts');
  await knex.raw('drop function if exists grid_counts_skip_gone_blocks()');
}
