import type { Knex } from 'knex';

/**
 * Judgement settings laid over the code's defaults (lib/viticulture/settings.ts): one override per
 * organisation and one per block, each a partial `{ group: { key: value } }` object. The app checks
 * the values (lib/validation/settings.ts and mergeSettings) before it writes; the database keeps
 * only the shape (an object) and who changed it when.
 */
export async function up(knex: Knex) {
  await knex.schema.createTable('organisation_settings', (t) => {
    t.uuid('organisation_id').primary().references('organisations.id').onDelete('CASCADE');
    t.jsonb('overrides').notNullable().defaultTo('{}');
    t.uuid('updated_by').references('users.id').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('block_settings', (t) => {
    t.uuid('block_id').primary().references('blocks.id').onDelete('CASCADE');
    t.uuid('organisation_id').notNullable().references('organisations.id').onDelete('CASCADE');
    t.jsonb('overrides').notNullable().defaultTo('{}');
    t.uuid('updated_by').references('users.id').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['organisation_id']);
  });
  for (const table of ['organisation_settings', 'block_settings']) {
    await knex.raw(`alter table ${table} add constraint ${table}_overrides_object check (jsonb_typeof(overrides) = 'object')`);
  }
}

export async function down(knex: Knex) {
  await knex.schema.dropTableIfExists('block_settings');
  await knex.schema.dropTableIfExists('organisation_settings');
}
