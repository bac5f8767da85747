import type { Knex } from 'knex';

// The sweep asks, page by page of the bucket's uploads, which ones a pending photo still waits on.
export async function up(knex: Knex) {
  await knex.raw(`create index photos_pending_upload_key on photos (upload_key) where status = 'pending'`);
}

export async function down(knex: Knex) {
  await knex.raw('drop index photos_pending_upload_key');
}
