import type { Knex } from 'knex';

// Where a photo was taken, kept only for organisations that chose to keep location; the image
// file itself never keeps location or camera metadata.
export async function up(knex: Knex) {
  await knex.schema.alterTable('photos', (t) => {
    t.double('latitude');
    t.double('longitude');
  });
}

export async function down(knex: Knex) {
  await knex.schema.alterTable('photos', (t) => {
    t.dropColumn('latitude');
    t.dropColumn('longitude');
  });
}
